import { z } from 'zod';
import './messages';
import { emailSchema } from './auth';
import { idSchema } from './team';
import { toMinor } from '../orders/money';
import type { OrderCurrency } from '../orders/money';

/** An order's road from quote to hand-over (our own names; the labels are what people read). */
export const ORDER_STATES = [
  'quote',
  'proof-out',
  'changes',
  'approved',
  'deposit',
  'paid',
  'making',
  'ready',
  'handed-over',
  'cancelled',
] as const;
export type OrderState = (typeof ORDER_STATES)[number];

export const ORDER_STATE_LABELS: Record<OrderState, string> = {
  quote: 'Quote',
  'proof-out': 'Proof with the buyer',
  changes: 'Changes asked',
  approved: 'Approved',
  deposit: 'Deposit paid',
  paid: 'Paid in full',
  making: 'In production',
  ready: 'Ready',
  'handed-over': 'Handed over',
  cancelled: 'Cancelled',
};

/**
 * The moves the shop makes by hand, and where from. Proofs move an order to proof-out, the buyer to
 * changes or approved, and only the payment service's signed notices to deposit or paid.
 */
export const HAND_MOVES: Partial<Record<OrderState, readonly OrderState[]>> = {
  making: ['deposit', 'paid'],
  ready: ['making'],
  'handed-over': ['ready'],
  cancelled: ['quote', 'proof-out', 'changes', 'approved', 'deposit', 'paid', 'making', 'ready'],
};
/** Lines and prices change only before the buyer approves. */
export const EDITABLE_STATES: readonly OrderState[] = ['quote', 'changes'];

const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters`);

/** A price in major units with at most two decimals (a number or its text), as whole cents. */
const priceSchema = z.union([z.number(), z.string()], { error: 'Give a price, like 1.25' }).transform((value, ctx) => {
  const minor = toMinor(value);
  if (minor === null) {
    ctx.addIssue({
      code: 'custom',
      message: `Give the price in whole cents, like 1.25: ${String(value).slice(0, 20)} is not a price we can charge.`,
    });
    return z.NEVER;
  }
  return minor;
});

export const customerInputSchema = z.object({
  name: z.string().trim().min(1, 'Give the buyer a name').max(120, 'Use at most 120 characters'),
  email: emailSchema,
  notes: text(2000).default(''),
});
export type CustomerInput = z.infer<typeof customerInputSchema>;

export const orderInputSchema = z.object({
  customerId: idSchema,
  /** Share of the total asked before production (0: pay in full up front). */
  depositPercent: z.coerce
    .number({ error: 'Deposit: give a percentage' })
    .int('Deposit: a whole percentage')
    .min(0, 'Deposit: not below 0 %')
    .max(100, 'Deposit: at most 100 %')
    .default(50),
  notes: text(2000).default(''),
});
export type OrderInput = z.infer<typeof orderInputSchema>;

const quantity = (label: string) =>
  z.coerce
    .number({ error: `${label}: give a number` })
    .int(`${label}: a whole number`)
    .min(1, `${label}: at least 1`)
    .max(100_000, `${label}: at most 100,000`);

export const orderLineInputSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({
      kind: z.literal('singles'),
      artId: idSchema,
      /** Finished width of one sticker, border included (mm). */
      finishedWidthMm: z.coerce
        .number({ error: 'Finished size: give a width' })
        .min(10, 'Finished size: at least 10 mm (0.4 in)')
        .max(1000, 'Finished size: at most 1000 mm'),
      quantity: quantity('Quantity'),
      stockId: idSchema.nullable().default(null),
      unitPrice: priceSchema.optional(),
    }),
    z.object({
      kind: z.literal('sheet'),
      sheetId: idSchema,
      quantity: quantity('Copies'),
      stockId: idSchema.nullable().default(null),
      unitPrice: priceSchema.optional(),
    }),
  ],
  { error: 'Pick what the line is: die-cut singles of one art, or copies of a sheet' },
);
export type OrderLineInput = z.infer<typeof orderLineInputSchema>;

export const linePriceSchema = z.object({ unitPrice: priceSchema });
export const orderMoveSchema = z.object({
  to: z.enum(['making', 'ready', 'handed-over', 'cancelled'], { error: 'Pick a step: in production, ready, handed over or cancelled' }),
  note: text(500).default(''),
});
export const refundInputSchema = z.object({ amount: priceSchema, reason: text(500).default('') });
export const orderListQuerySchema = z.object({
  state: z.enum(ORDER_STATES).optional(),
  customerId: idSchema.optional(),
  q: text(100).optional(),
});
export const orderParamsSchema = z.object({ teamId: idSchema, orderId: idSchema });

/** What the buyer sends from the proof page. */
export const proofApproveSchema = z.object({
  name: z.string().trim().min(2, 'Type your name to approve').max(120, 'Use at most 120 characters'),
});
export const proofChangesSchema = z.object({
  comment: z.string().trim().min(3, 'Say what should change').max(2000, 'Use at most 2000 characters'),
});
export const proofTokenSchema = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'Not a proof link') });

export type CustomerView = { id: string; name: string; email: string; notes: string; orders: number };

export type OrderLineView = {
  id: string;
  kind: 'singles' | 'sheet';
  artId: string | null;
  sheetId: string | null;
  /** What the line is, in words: the art's or sheet's name. */
  title: string;
  finishedWidthMm: number | null;
  quantity: number;
  stockId: string | null;
  stockName: string | null;
  /** null when the viewer may not see money. */
  unitPriceMinor: number | null;
  totalMinor: number | null;
  priceFrom: 'cost' | 'hand' | null;
};

export type OrderEventView = { at: string; who: string; what: string };

export type ProofView = {
  id: string;
  status: 'open' | 'approved' | 'changes' | 'replaced';
  sentTo: string;
  sentAt: string;
  expiresAt: string;
  decidedAt: string | null;
  decidedName: string | null;
  comment: string | null;
  /** The frozen lines the buyer saw (prices null when hidden). */
  lines: ProofLine[];
};
export type ProofLine = {
  title: string;
  /** The picture the buyer saw (the sticker with its cut line), for members; null when there is none. */
  pictureUrl?: string | null;
  finishedWidthMm: number | null;
  finishedHeightMm: number | null;
  quantity: number;
  stockName: string | null;
  unitPriceMinor: number | null;
  totalMinor: number | null;
};

export type PaymentView = {
  id: string;
  kind: 'deposit' | 'balance' | 'refund';
  status: 'open' | 'paid' | 'refunded' | 'expired';
  amountMinor: number;
  createdAt: string;
};

export type OrderView = {
  id: string;
  number: number;
  state: OrderState;
  customer: { id: string; name: string; email: string };
  currency: OrderCurrency;
  depositPercent: number;
  notes: string;
  lines: OrderLineView[];
  /** Money, or null for a viewer when the owner hides prices. */
  totalMinor: number | null;
  paidMinor: number | null;
  refundedMinor: number | null;
  dueMinor: number | null;
  costMinor: number | null;
  marginMinor: number | null;
  proofs: ProofView[];
  payments: PaymentView[];
  events: OrderEventView[];
  sheetIds: string[];
  createdAt: string;
  updatedAt: string;
};

export type OrderSummary = Pick<
  OrderView,
  'id' | 'number' | 'state' | 'customer' | 'currency' | 'totalMinor' | 'paidMinor' | 'updatedAt'
> & {
  lines: number;
};
export type OrderBoard = {
  orders: OrderSummary[];
  /** Count and total (cents, null when hidden) per state. */
  totals: Record<OrderState, { count: number; totalMinor: number | null }>;
};
