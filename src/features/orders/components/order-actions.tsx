import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router';
import type { Role } from '@shared/permissions';
import { can } from '@shared/permissions';
import { formatMinor } from '@shared/orders/money';
import type { OrderView } from '@shared/schemas/orders';
import { useAction } from '@/hooks/use-action';
import { ordersApi, useOrderChange } from '../api/orders';

const button = 'rounded-full px-4 py-2 font-bold disabled:opacity-50';
const primary = `${button} bg-ink text-paper`;
const second = `${button} border-2 border-paper-edge text-ink hover:border-ink`;

/** What can be done next with the order, for this member's role: proof, sheets, payment, production, refund. */
export function OrderActions({ teamId, order, role }: { teamId: string; order: OrderView; role: Role | undefined }) {
  const act = useAction();
  const note = useForm({ defaultValues: { message: '' } });
  const [sent, setSent] = useState<string | null>(null);
  const refund = useForm({ defaultValues: { amount: '', reason: '' } });
  const change = useOrderChange(teamId, order.id, (f: () => Promise<OrderView | { order: OrderView }>) => f());
  // The answer is awaited before `done` is looked at: `done?.(await …)` would skip the call itself when there is no `done`.
  const run = (f: () => Promise<OrderView | { order: OrderView }>, done?: (answer: OrderView | { order: OrderView }) => void) =>
    act.run(async () => {
      const answer = await change.mutateAsync(f);
      done?.(answer);
    });
  const quoting = can(role, 'orders.quote');
  const paying = can(role, 'orders.payments');
  const due = order.dueMinor ?? 0;

  return (
    <section aria-labelledby="next-title" className="flex flex-col gap-3 rounded-sticker border-2 border-ink bg-white p-4">
      <h2 id="next-title" className="text-xl font-extrabold text-ink">
        Next
      </h2>
      {quoting && (order.state === 'quote' || order.state === 'changes') && (
        <div className="flex flex-col gap-2">
          <label className="text-sm font-bold text-ink">
            A note for the buyer (optional)
            <textarea
              className="w-full rounded-lg border-2 border-paper-edge px-2 py-1 font-normal"
              rows={2}
              {...note.register('message')}
            />
          </label>
          <button
            type="button"
            className={primary}
            disabled={act.busy}
            onClick={() =>
              void run(
                () => ordersApi.sendProof(teamId, order.id, note.getValues('message')),
                () => setSent(`Proof sent to ${order.customer.email}.`),
              )
            }
          >
            {order.proofs.length ? 'Send a new proof' : 'Send the proof'}
          </button>
          <p className="text-xs text-ink-faint">
            The buyer gets a link to approve it or ask for changes; nothing is printed before they approve.
          </p>
        </div>
      )}
      {order.state === 'proof-out' && (
        <p className="text-ink-soft">The proof is with {order.customer.name}: you will get an e-mail when they answer.</p>
      )}
      {quoting &&
        can(role, 'sheets.edit') &&
        ['approved', 'deposit', 'paid', 'making'].includes(order.state) &&
        order.sheetIds.length === 0 &&
        order.lines.some((l) => l.kind === 'singles') && (
          <button
            type="button"
            className={primary}
            disabled={act.busy}
            onClick={() => void run(() => ordersApi.makeSheets(teamId, order.id))}
          >
            {act.busy ? 'Laying the stickers out…' : 'Make the sheets for this order'}
          </button>
        )}
      {order.sheetIds.length > 0 && (
        <div>
          <p className="font-bold text-ink">Sheets for this order</p>
          <ul className="flex flex-wrap gap-2">
            {order.sheetIds.map((id, i) => (
              <li key={id}>
                <Link to={`/t/${teamId}/sheets/${id}`} className="text-ink underline">
                  Sheet {i + 1}
                </Link>
              </li>
            ))}
          </ul>
        </div>
      )}
      {paying && ['approved', 'deposit', 'making', 'ready'].includes(order.state) && due > 0 && (
        <button
          type="button"
          className={second}
          disabled={act.busy}
          onClick={() =>
            void act.run(async () =>
              setSent(
                `Payment link for ${formatMinor((await ordersApi.paymentLink(teamId, order.id)).amountMinor, order.currency)} sent to ${order.customer.email}.`,
              ),
            )
          }
        >
          E-mail a payment link ({formatMinor(due, order.currency)})
        </button>
      )}
      {quoting && (
        <div className="flex flex-wrap gap-2">
          {order.state === 'deposit' || order.state === 'paid' ? (
            <button
              type="button"
              className={second}
              disabled={act.busy}
              onClick={() => void run(() => ordersApi.move(teamId, order.id, 'making'))}
            >
              Into production
            </button>
          ) : null}
          {order.state === 'making' && (
            <button
              type="button"
              className={second}
              disabled={act.busy}
              onClick={() => void run(() => ordersApi.move(teamId, order.id, 'ready'))}
            >
              Ready for the buyer
            </button>
          )}
          {order.state === 'ready' && (
            <button
              type="button"
              className={second}
              disabled={act.busy}
              onClick={() => void run(() => ordersApi.move(teamId, order.id, 'handed-over'))}
            >
              Handed over
            </button>
          )}
          {!['handed-over', 'cancelled'].includes(order.state) && (
            <button
              type="button"
              className={`${button} text-alarm underline`}
              disabled={act.busy}
              onClick={() =>
                window.confirm(`Cancel order ${order.number}? Refund what was paid separately.`) &&
                void run(() => ordersApi.move(teamId, order.id, 'cancelled'))
              }
            >
              Cancel the order
            </button>
          )}
        </div>
      )}
      {paying && can(role, 'orders.money') && (order.paidMinor ?? 0) > (order.refundedMinor ?? 0) && (
        <form
          className="flex flex-wrap items-end gap-2 border-t-2 border-paper-edge pt-3"
          onSubmit={refund.handleSubmit(
            ({ amount, reason }) =>
              void run(
                () => ordersApi.refund(teamId, order.id, amount, reason),
                () => refund.reset({ amount: '', reason: '' }),
              ),
          )}
        >
          <label className="text-sm font-bold text-ink">
            Refund
            <input
              className="block w-28 rounded-lg border-2 border-paper-edge px-2 py-1 font-normal"
              inputMode="decimal"
              {...refund.register('amount')}
            />
          </label>
          <label className="flex-1 text-sm font-bold text-ink">
            Why
            <input className="block w-full rounded-lg border-2 border-paper-edge px-2 py-1 font-normal" {...refund.register('reason')} />
          </label>
          <button type="submit" className={second} disabled={act.busy}>
            Refund
          </button>
        </form>
      )}
      {sent && (
        <p role="status" className="font-bold text-sage-deep">
          {sent}
        </p>
      )}
      {act.error && (
        <p role="alert" className="font-bold text-alarm">
          {act.error}
        </p>
      )}
    </section>
  );
}
