import type { RequestHandler } from 'express';
import multer from 'multer';
import { ERROR_CODES } from '@shared/schemas/api-error';
import { AppError } from '../lib/errors';

type UploadLimits = { maxBytes: number; fields: number; fieldBytes: number };

/** A licence proof: one file of up to 10 MB and nothing much besides. */
export const PROOF_LIMITS: UploadLimits = { maxBytes: 10 * 1024 * 1024, fields: 4, fieldBytes: 1024 };

export const sizeText = (bytes: number) =>
  bytes >= 1024 * 1024 ? `${Math.round(bytes / (1024 * 1024))} MB` : `${Math.max(1, Math.round(bytes / 1024))} KB`;

/**
 * One file in `field`, held in memory, with every multer limit set: file size, number of files,
 * of text fields and of parts, and the size of each text field and name. A refused or malformed
 * body becomes a 400 (or 413 for the file size) in a maker's words before any route code runs.
 */
export function singleUpload(field: string, limits: UploadLimits): RequestHandler {
  const handler = multer({
    storage: multer.memoryStorage(),
    limits: {
      fileSize: limits.maxBytes,
      files: 1,
      fields: limits.fields,
      fieldSize: limits.fieldBytes,
      fieldNameSize: 100,
      parts: limits.fields + 1,
      headerPairs: 100,
    },
  }).single(field);
  return (req, res, next) => {
    handler(req, res, (error?: unknown) => {
      if (!error) return next();
      next(uploadError(error, field, limits));
    });
  };
}

function uploadError(error: unknown, field: string, limits: UploadLimits): AppError {
  const code = (error as { code?: string }).code;
  const refused = (message: string, status = 400) =>
    new AppError(status, status === 413 ? ERROR_CODES.payloadTooLarge : ERROR_CODES.validation, message);
  switch (code) {
    case 'LIMIT_FILE_SIZE':
      return refused(`That file is larger than the ${sizeText(limits.maxBytes)} limit for this upload.`, 413);
    case 'LIMIT_FIELD_VALUE':
      return refused(`Upload refused: a text field is too long (at most ${sizeText(limits.fieldBytes)}).`);
    case 'LIMIT_FIELD_COUNT':
    case 'LIMIT_PART_COUNT':
      return refused(`Upload refused: too many fields (at most ${limits.fields} besides the file).`);
    case 'LIMIT_FIELD_KEY':
      return refused('Upload refused: a field name is too long.');
    case 'LIMIT_FILE_COUNT':
    case 'LIMIT_UNEXPECTED_FILE':
      return refused(`Upload refused: send one file, in the "${field}" field.`);
    default:
      // busboy's own errors: a malformed part header, a body cut off, no boundary.
      return refused('The upload could not be read: it was cut off or is not a proper form upload. Try again.');
  }
}
