// A local stand-in for the payments service, so the whole order flow works on a laptop and in tests
// with no account and no network. The `stripe` SDK is pointed at it (host, port, protocol) and talks
// to it exactly as to the real API: form-encoded requests, JSON objects back, errors in the same
// shape. It keeps checkout sessions and refunds in memory, serves a test checkout page where the
// buyer "pays", and sends the resulting event to the registered webhook endpoints, signed as the
// real service signs them (Stripe-Signature: t=<unix seconds>,v1=<HMAC-SHA256 of "t.body" with the
// endpoint's secret>), which the app checks with the SDK's own verifier. No real money moves.
import { createHmac, randomBytes } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { createServer } from 'node:http';
import type { Server } from 'node:http';
import express from 'express';
import type { Request, Response } from 'express';

export type FakeEndpoint = { url: string; secret: string };
type Session = {
  id: string;
  object: 'checkout.session';
  mode: 'payment';
  status: 'open' | 'complete' | 'expired';
  payment_status: 'unpaid' | 'paid';
  amount_total: number;
  currency: string;
  customer_email: string | null;
  metadata: Record<string, string>;
  payment_intent: string | null;
  success_url: string;
  cancel_url: string;
  url: string | null;
  created: number;
  livemode: false;
  description: string;
};
type Refund = {
  id: string;
  object: 'refund';
  amount: number;
  currency: string;
  payment_intent: string;
  status: 'succeeded';
  created: number;
  metadata: Record<string, string>;
};
export type SentEvent = { id: string; type: string; payload: string; signature: string; url: string; status: number | null };

const now = () => Math.floor(Date.now() / 1000);
const id = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`;
const escape = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** The header the payments service sends with each event: what `stripe.webhooks.constructEvent` checks. */
export function signPayload(payload: string, secret: string, timestamp = now()): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

function apiError(res: Response, status: number, message: string, param?: string) {
  res.status(status).json({ error: { type: 'invalid_request_error', message, ...(param ? { param } : {}) } });
}

export type FakePayments = {
  url: string;
  endpoints: FakeEndpoint[];
  sessions: Map<string, Session>;
  /** Every event sent, with its exact body and signature (tests replay them). */
  sent: SentEvent[];
  /** Completes a session as the checkout page's Pay button does (tests use it without a browser). */
  pay: (sessionId: string) => Promise<void>;
  close: () => Promise<void>;
};

export async function startFakePayments(options: { port?: number; host?: string; endpoints?: FakeEndpoint[] } = {}): Promise<FakePayments> {
  const host = options.host ?? '127.0.0.1';
  const sessions = new Map<string, Session>();
  const refunds = new Map<string, Refund>();
  const paidByIntent = new Map<string, { amount: number; refunded: number; currency: string }>();
  const endpoints = [...(options.endpoints ?? [])];
  const sent: SentEvent[] = [];
  let base = '';

  async function deliver(type: string, object: unknown) {
    const event = {
      id: id('evt'),
      object: 'event',
      api_version: null,
      created: now(),
      livemode: false,
      type,
      data: { object },
      pending_webhooks: endpoints.length,
    };
    const payload = JSON.stringify(event);
    for (const endpoint of endpoints) {
      const signature = signPayload(payload, endpoint.secret);
      const record: SentEvent = { id: event.id, type, payload, signature, url: endpoint.url, status: null };
      sent.push(record);
      // Like the real service: a few tries, then it gives up (the app can be asked again by id).
      for (let attempt = 0; attempt < 3 && (record.status === null || record.status >= 500); attempt++) {
        try {
          const res = await fetch(endpoint.url, {
            method: 'POST',
            headers: { 'content-type': 'application/json', 'stripe-signature': signature },
            body: payload,
          });
          record.status = res.status;
        } catch {
          record.status = null;
          await new Promise((r) => setTimeout(r, 200 * (attempt + 1)));
        }
      }
    }
  }

  async function complete(session: Session) {
    session.status = 'complete';
    session.payment_status = 'paid';
    session.payment_intent = id('pi');
    paidByIntent.set(session.payment_intent, { amount: session.amount_total, refunded: 0, currency: session.currency });
    await deliver('checkout.session.completed', session);
  }

  const app = express();
  app.disable('x-powered-by');
  const api = express.Router();
  api.use(express.urlencoded({ extended: true, limit: '100kb' }));
  api.use((req, res, next) => {
    const auth = req.get('authorization') ?? '';
    if (!/^Bearer sk_test_\w+/.test(auth)) return apiError(res, 401, 'No valid test API key provided.');
    next();
  });

  api.post('/checkout/sessions', (req: Request, res: Response) => {
    const body = req.body as Record<string, unknown>;
    const items = Array.isArray(body.line_items) ? (body.line_items as Array<Record<string, unknown>>) : [];
    if (body.mode !== 'payment') return apiError(res, 400, 'Only mode=payment is supported by the local payments fake.', 'mode');
    if (items.length === 0) return apiError(res, 400, 'Missing required param: line_items.', 'line_items');
    if (typeof body.success_url !== 'string' || typeof body.cancel_url !== 'string')
      return apiError(res, 400, 'Missing required param: success_url.', 'success_url');
    let total = 0;
    let currency = '';
    const names: string[] = [];
    for (const [i, item] of items.entries()) {
      const price = (item.price_data ?? {}) as Record<string, unknown>;
      const unit = Number(price.unit_amount);
      const qty = Number(item.quantity ?? 1);
      if (!/^\d+$/.test(String(price.unit_amount)) || unit < 50)
        return apiError(
          res,
          400,
          'Amount must be at least 50 cents and a whole number of cents.',
          `line_items[${i}][price_data][unit_amount]`,
        );
      if (!Number.isInteger(qty) || qty < 1) return apiError(res, 400, 'Invalid quantity.', `line_items[${i}][quantity]`);
      currency = String(price.currency ?? '').toLowerCase();
      names.push(String(((price.product_data ?? {}) as Record<string, unknown>).name ?? 'Item'));
      total += unit * qty;
    }
    const session: Session = {
      id: id('cs_test'),
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      amount_total: total,
      currency,
      customer_email: typeof body.customer_email === 'string' ? body.customer_email : null,
      metadata: (body.metadata ?? {}) as Record<string, string>,
      payment_intent: null,
      success_url: body.success_url,
      cancel_url: body.cancel_url,
      url: null,
      created: now(),
      livemode: false,
      description: names.join(', '),
    };
    session.url = `${base}/pay/${session.id}`;
    sessions.set(session.id, session);
    res.json(session);
  });

  api.get('/checkout/sessions/:id', (req, res) => {
    const session = sessions.get(req.params.id);
    if (!session) return apiError(res, 404, `No such checkout.session: '${req.params.id}'`, 'id');
    res.json(session);
  });

  api.post('/checkout/sessions/:id/expire', (req, res) => {
    const session = sessions.get(req.params.id);
    if (!session) return apiError(res, 404, `No such checkout.session: '${req.params.id}'`, 'id');
    if (session.status !== 'open') return apiError(res, 400, 'Only open sessions can be expired.');
    session.status = 'expired';
    session.url = null;
    res.json(session);
  });

  api.post('/refunds', (req, res) => {
    const body = req.body as Record<string, unknown>;
    const intent = paidByIntent.get(String(body.payment_intent ?? ''));
    if (!intent) return apiError(res, 400, `No such payment_intent: '${String(body.payment_intent)}'`, 'payment_intent');
    const amount = body.amount === undefined ? intent.amount - intent.refunded : Number(body.amount);
    if (!/^\d+$/.test(String(amount)) || amount < 1) return apiError(res, 400, 'Invalid positive integer', 'amount');
    if (amount > intent.amount - intent.refunded)
      return apiError(
        res,
        400,
        `Refund amount (${amount}) is greater than unrefunded amount on charge (${intent.amount - intent.refunded})`,
        'amount',
      );
    intent.refunded += amount;
    const refund: Refund = {
      id: id('re'),
      object: 'refund',
      amount,
      currency: intent.currency,
      payment_intent: String(body.payment_intent),
      status: 'succeeded',
      created: now(),
      metadata: (body.metadata ?? {}) as Record<string, string>,
    };
    refunds.set(refund.id, refund);
    res.json(refund);
  });

  api.post('/webhook_endpoints', (req, res) => {
    const body = req.body as Record<string, unknown>;
    if (typeof body.url !== 'string') return apiError(res, 400, 'Missing required param: url.', 'url');
    const endpoint = { url: body.url, secret: `whsec_${randomBytes(24).toString('hex')}` };
    endpoints.push(endpoint);
    res.json({ id: id('we'), object: 'webhook_endpoint', url: endpoint.url, secret: endpoint.secret, status: 'enabled' });
  });

  api.use((_req, res) =>
    apiError(res, 404, 'Unrecognized request URL: the local payments fake knows checkout sessions, refunds and webhook endpoints.'),
  );
  app.use('/v1', api);

  // The test checkout page: what the buyer sees instead of the real payment form.
  const page = (title: string, body: string) =>
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${title}</title>
<style>body{font:16px/1.5 system-ui,sans-serif;background:#f3efe6;color:#2b2620;margin:0;display:grid;place-items:center;min-height:100vh}
main{background:#fff;border:2px solid #2b2620;border-radius:14px;padding:28px 32px;max-width:420px}
.tag{display:inline-block;background:#ffd84a;border-radius:6px;padding:2px 8px;font-size:13px;font-weight:700}
.amount{font-size:34px;font-weight:800;margin:8px 0}button{font:inherit;font-weight:700;border:2px solid #2b2620;border-radius:10px;padding:10px 18px;cursor:pointer}
.pay{background:#1f7a5a;color:#fff}.cancel{background:#fff}button:focus-visible{outline:3px solid #ffb000;outline-offset:2px}</style></head><body><main>${body}</main></body></html>`;
  const pageRouter = express.Router();
  pageRouter.use(express.urlencoded({ extended: false, limit: '10kb' }));
  pageRouter.get('/pay/:id', (req, res) => {
    const session = sessions.get(req.params.id);
    if (!session) return res.status(404).send(page('Not found', '<h1>This payment link is not known.</h1>'));
    if (session.status !== 'open') return res.status(410).send(page('Closed', '<h1>This payment is already closed.</h1>'));
    const amount = `${(session.amount_total / 100).toFixed(2)} ${session.currency.toUpperCase()}`;
    res.send(
      page(
        'Test checkout',
        `<span class="tag">Test payment: no real money moves</span><h1>Pay for your stickers</h1><p>${escape(session.description)}</p>
<p class="amount" data-amount-minor="${session.amount_total}">${escape(amount)}</p>
<form method="post" action="/pay/${session.id}"><button class="pay" type="submit">Pay ${escape(amount)}</button></form>
<form method="post" action="/pay/${session.id}/cancel" style="margin-top:10px"><button class="cancel" type="submit">Go back without paying</button></form>`,
      ),
    );
  });
  pageRouter.post('/pay/:id', async (req, res) => {
    const session = sessions.get(req.params.id);
    if (!session || session.status !== 'open') return res.status(410).send(page('Closed', '<h1>This payment is already closed.</h1>'));
    await complete(session);
    res.redirect(303, session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id));
  });
  pageRouter.post('/pay/:id/cancel', (req, res) => {
    const session = sessions.get(req.params.id);
    if (!session) return res.status(404).send(page('Not found', '<h1>This payment link is not known.</h1>'));
    res.redirect(303, session.cancel_url);
  });
  app.use(pageRouter);

  // A plain http server: its 'error' (a port in use) rejects, where app.listen would call back either way.
  const server: Server = createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => resolve());
  });
  base = `http://${host}:${(server.address() as AddressInfo).port}`;
  return {
    url: base,
    endpoints,
    sessions,
    sent,
    pay: async (sessionId) => {
      const session = sessions.get(sessionId);
      if (!session || session.status !== 'open') throw new Error(`no open session ${sessionId}`);
      await complete(session);
    },
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}
