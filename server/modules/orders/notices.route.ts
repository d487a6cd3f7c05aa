import express from 'express';
import type { NextFunction, Request, Response } from 'express';
import { AppError } from '../../lib/errors';
import type { PaymentsService } from './payments.service';

/** POST /api/payments/notices: the raw body (its signature covers the exact bytes), answered in JSON. */
export function paymentNoticesRoute(payments: PaymentsService) {
  return [
    express.raw({ type: 'application/json', limit: '1mb' }),
    async (req: Request, res: Response, _next: NextFunction) => {
      try {
        const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
        res.json(await payments.notice(body, req.get('stripe-signature')));
      } catch (error) {
        if (error instanceof AppError) return res.status(error.status).json({ error: { code: error.code, message: error.message } });
        req.log?.error({ err: error }, 'payment notice failed');
        // 500: the payment service tries again later, which is what we want when our side failed.
        res.status(500).json({ error: { code: 'internal_error', message: 'The notice could not be stored; send it again.' } });
      }
    },
  ] as const;
}
