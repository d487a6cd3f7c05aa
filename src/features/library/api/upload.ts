import type { UploadResult } from '@shared/schemas/library';
import { ApiError, api } from '@/lib/api-client';
import { apiErrorSchema } from '@shared/schemas/api-error';

/**
 * Uploads one file (an image or a zip) with progress. fetch() cannot report upload progress, so
 * this one call uses XMLHttpRequest; it still sends the session's CSRF token.
 */
export async function uploadArt(
  teamId: string,
  file: File,
  fields: { keywords: string; collectionId: string },
  onProgress: (fraction: number) => void,
): Promise<UploadResult[]> {
  const token = await api<{ csrfToken: string }>('GET', '/auth/csrf').then((r) => r.csrfToken);
  const form = new FormData();
  form.set('keywords', fields.keywords);
  if (fields.collectionId) form.set('collectionId', fields.collectionId);
  form.set('file', file, file.name);
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/teams/${teamId}/art`);
    xhr.setRequestHeader('x-csrf-token', token);
    xhr.upload.onprogress = (event) => event.lengthComputable && onProgress(event.loaded / event.total);
    xhr.onerror = () => reject(new ApiError(0, 'offline', 'The upload was interrupted. Check your connection and try again.'));
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        /* not JSON */
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        onProgress(1);
        resolve((body as { results: UploadResult[] }).results);
        return;
      }
      const parsed = apiErrorSchema.safeParse(body);
      reject(
        parsed.success
          ? new ApiError(xhr.status, parsed.data.error.code, parsed.data.error.message)
          : new ApiError(xhr.status, 'unknown', `Upload failed (${xhr.status}).`),
      );
    };
    xhr.send(form);
  });
}
