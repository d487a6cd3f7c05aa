// The buyer's side, without an account: the proof page behind a signed link, its pictures, the
// approve and ask-for-changes forms, and the way to payment. Plain server-made HTML (no app
// script, nothing of the team but this proof), rate-limited per client address.
import express, { Router } from 'express';
import type { z } from 'zod';
import type { NextFunction, Request, Response } from 'express';
import { amountDue, formatMinor } from '@shared/orders/money';
import { proofApproveSchema, proofChangesSchema, proofTokenSchema } from '@shared/schemas/orders';
import { formatLength } from '@shared/units';
import { AppError } from '../../lib/errors';
import type { RateLimits } from '../../lib/rate-limits';
import { fieldMessages } from '../../middleware/validate';
import type { PaymentsService } from './payments.service';
import type { ProofsService } from './proofs.service';

const tokenOf = (req: Request) => String(req.params.token);
const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
const both = (mm: number | null) => (mm === null ? '' : `${formatLength(mm, 'in')} (${formatLength(mm, 'mm')})`);

const CSS = `body{font:16px/1.5 system-ui,sans-serif;background:#f6f1e7;color:#2a2521;margin:0}
main{max-width:860px;margin:0 auto;padding:24px 20px 60px}h1{font-size:28px;margin:0 0 4px}
.line{display:grid;grid-template-columns:minmax(160px,280px) 1fr;gap:20px;background:#fff;border:2px solid #2a2521;border-radius:14px;padding:16px;margin:16px 0}
.line img{max-width:100%;height:auto;border-radius:8px;background:#e9e4da}
dl{display:grid;grid-template-columns:auto 1fr;gap:2px 14px;margin:0}dt{font-weight:700}
.note{background:#fff6cf;border-left:5px solid #e0a800;padding:10px 14px;border-radius:6px}
.done{background:#dff3e7;border-left:5px solid #1f7a5a;padding:10px 14px;border-radius:6px}
form{background:#fff;border:2px solid #2a2521;border-radius:14px;padding:16px;margin:16px 0}
label{display:block;font-weight:700;margin-bottom:4px}input,textarea{font:inherit;width:100%;box-sizing:border-box;border:2px solid #2a2521;border-radius:8px;padding:8px}
button{font:inherit;font-weight:700;border:2px solid #2a2521;border-radius:10px;padding:10px 18px;margin-top:10px;cursor:pointer;background:#1f7a5a;color:#fff}
button.second{background:#fff;color:#2a2521}:focus-visible{outline:3px solid #ffb000;outline-offset:2px}
.error{color:#a3261b;font-weight:700}.total{font-size:20px;font-weight:800}
@media (max-width:640px){.line{grid-template-columns:1fr}}`;

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex"><title>${esc(title)}</title><link rel="stylesheet" href="/proof-assets/proof.css"></head><body><main>${body}</main></body></html>`;
}

type Opened = Awaited<ReturnType<ProofsService['open']>>;

function proofHtml(token: string, { proof, order, snapshot }: Opened, notice: { error?: string; paid?: boolean }) {
  const money = (m: number) => formatMinor(m, snapshot.currency);
  const lines = snapshot.lines
    .map(
      (l, i) => `<section class="line" aria-label="${esc(l.title)}">
${l.imageKey ? `<img src="/proof/${token}/pictures/${i}.png" alt="${esc(l.title)} with its cut line drawn in pink">` : '<p>No picture</p>'}
<dl><dt>Stickers</dt><dd>${esc(l.title)}</dd>
${l.finishedWidthMm !== null ? `<dt>Finished size</dt><dd>${both(l.finishedWidthMm)} × ${both(l.finishedHeightMm)}</dd>` : '<dt>What</dt><dd>Printed sheets, cut as shown</dd>'}
<dt>${l.kind === 'singles' ? 'Quantity' : 'Copies'}</dt><dd>${l.quantity}</dd>
<dt>Stock</dt><dd>${esc(l.stockName ?? 'As agreed with the shop')}</dd>
<dt>Price</dt><dd>${money(l.unitPriceMinor)} each, ${money(l.totalMinor)}</dd></dl></section>`,
    )
    .join('\n');
  const due = amountDue(snapshot.totalMinor, order.paidMinor, order.depositPercent);
  const status =
    proof.status === 'approved'
      ? `<p class="done" role="status">Approved by ${esc(proof.decidedName ?? '')} on ${proof.decidedAt!.toISOString().slice(0, 16).replace('T', ' ')} UTC.</p>`
      : proof.status === 'changes'
        ? `<p class="note" role="status">You asked for changes: “${esc(proof.comment ?? '')}”. The shop will send a new proof.</p>`
        : '';
  const payable = proof.status === 'approved' && ['approved', 'deposit', 'making', 'ready'].includes(order.state) && due.minor > 0;
  const forms =
    proof.status === 'open'
      ? `<p class="note">Check each picture: the pink line is where the blade cuts. Colours on screen differ a little from print.</p>
<form method="post" action="/proof/${token}/approve"><label for="name">Type your name to approve this proof</label>
<input id="name" name="name" autocomplete="name" required minlength="2" maxlength="120"><button type="submit">Approve this proof</button></form>
<form method="post" action="/proof/${token}/changes"><label for="comment">Or tell the shop what to change</label>
<textarea id="comment" name="comment" rows="4" required minlength="3" maxlength="2000"></textarea><button class="second" type="submit">Ask for changes</button></form>`
      : payable
        ? `<form method="post" action="/proof/${token}/pay"><p>${due.kind === 'deposit' ? `Deposit (${snapshot.depositPercent} %)` : 'To pay'}: <strong>${money(due.minor)}</strong></p><button type="submit">Pay ${money(due.minor)}</button></form>`
        : '';
  return page(
    `Your sticker proof, order ${snapshot.orderNumber}`,
    `<h1>Your sticker proof</h1><p>Order ${snapshot.orderNumber}. Nothing is printed before you approve.</p>
${notice.error ? `<p class="error" role="alert">${esc(notice.error)}</p>` : ''}${notice.paid ? '<p class="done" role="status">Thank you: your payment is on its way to the shop.</p>' : ''}
${status}${lines}<p class="total">Total ${money(snapshot.totalMinor)}</p>${forms}`,
  );
}

/** Public routes: /proof/:token …, the proof stylesheet and the after-payment page. */
export function proofPageRouter(deps: {
  proofs: ProofsService;
  payments: PaymentsService;
  limits: RateLimits;
  appUrl: string;
  paymentsOrigin: string;
}): Router {
  const { proofs, payments, limits } = deps;
  const router = Router();
  router.use('/proof', express.urlencoded({ extended: false, limit: '20kb' }));
  const csp = `default-src 'self'; img-src 'self'; style-src 'self'; script-src 'none'; form-action 'self' ${deps.paymentsOrigin}; frame-ancestors 'none'; base-uri 'none'; object-src 'none'`;
  const guard = async (req: Request, res: Response, next: NextFunction) => {
    try {
      await limits.consume({ proofPerAddress: req.ip ?? 'unknown' });
      res.set({ 'Content-Security-Policy': csp, 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' });
      const token = proofTokenSchema.safeParse(req.params);
      if (!token.success) throw new AppError(404, 'not_found', 'That proof was not found.');
      next();
    } catch (error) {
      next(error);
    }
  };
  const show = async (req: Request, res: Response, notice: { error?: string; paid?: boolean } = {}, status = 200) =>
    res
      .status(status)
      .type('html')
      .send(proofHtml(tokenOf(req), await proofs.open(tokenOf(req)), notice));
  const handle = (fn: (req: Request, res: Response) => Promise<unknown>) => (req: Request, res: Response, next: NextFunction) =>
    fn(req, res).catch(next);

  router.get('/proof-assets/proof.css', (_req, res) => res.type('css').set('Cache-Control', 'public, max-age=3600').send(CSS));
  router.get(
    '/proof/:token',
    guard,
    handle((req, res) => show(req, res, { paid: req.query.paid === '1' })),
  );
  router.get(
    '/proof/:token/pictures/:index.png',
    guard,
    handle(async (req, res) => res.type('png').send(await proofs.picture(tokenOf(req), Number(req.params.index)))),
  );
  // The buyer's two answers: the form checked with its shared schema (a refusal shows on the page), then back to the proof.
  const answerRoute = <T>(schema: z.ZodType<T>, answer: (body: T) => Parameters<ProofsService['answer']>[1]) =>
    handle(async (req, res) => {
      const body = schema.safeParse(req.body);
      if (!body.success) return show(req, res, { error: Object.values(fieldMessages(body.error))[0] }, 400);
      await proofs.answer(tokenOf(req), answer(body.data), req.ip ?? 'unknown');
      res.redirect(303, `/proof/${tokenOf(req)}`);
    });
  router.post(
    '/proof/:token/approve',
    guard,
    answerRoute(proofApproveSchema, ({ name }) => ({ approve: true, name })),
  );
  router.post(
    '/proof/:token/changes',
    guard,
    answerRoute(proofChangesSchema, ({ comment }) => ({ approve: false, comment })),
  );
  router.post(
    '/proof/:token/pay',
    guard,
    handle(async (req, res) => {
      const { proof, order } = await proofs.open(tokenOf(req));
      if (proof.status !== 'approved') throw new AppError(409, 'conflict', 'Approve the proof first, then pay.');
      const { url } = await payments.checkout(
        order.teamId,
        order.id,
        { userId: null, name: 'Buyer' },
        `${deps.appUrl}/proof/${tokenOf(req)}`,
      );
      res.redirect(303, url);
    }),
  );
  router.get('/paid', (_req, res) =>
    res
      .set('Content-Security-Policy', csp)
      .type('html')
      .send(page('Thank you', '<h1>Thank you</h1><p>Your payment is on its way to the shop. You can close this page.</p>')),
  );
  // The buyer sees errors as a page, in words, never as JSON.
  router.use(['/proof', '/paid'], (error: unknown, req: Request, res: Response, _next: NextFunction) => {
    if (!(error instanceof AppError)) req.log?.error({ err: error }, 'proof page failed');
    const known =
      error instanceof AppError
        ? error
        : new AppError(500, 'internal_error', 'Something went wrong on our side: please try again in a minute.');
    if (known.retryAfter) res.set('Retry-After', String(known.retryAfter));
    res
      .status(known.status)
      .type('html')
      .send(page('Sticker proof', `<h1>Sticker proof</h1><p class="error" role="alert">${esc(known.message)}</p>`));
  });
  return router;
}
