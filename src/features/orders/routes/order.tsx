import { Link, useParams } from 'react-router';
import { formatMinor } from '@shared/orders/money';
import { EDITABLE_STATES, ORDER_STATE_LABELS } from '@shared/schemas/orders';
import type { OrderView, ProofView } from '@shared/schemas/orders';
import { can } from '@shared/permissions';
import { formatLength } from '@shared/units';
import type { LengthUnit } from '@shared/units';
import { PageTitle } from '@/components/page-title';
import { useMe } from '@/features/auth/api/me';
import { useOrder } from '../api/orders';
import { OrderActions } from '../components/order-actions';
import { OrderLines } from '../components/order-lines';

const PROOF_STATUS: Record<ProofView['status'], string> = {
  open: 'With the buyer',
  approved: 'Approved',
  changes: 'Changes asked',
  replaced: 'Replaced by a newer proof',
};

/** One order: its stickers, what to do next, the proofs as sent, payments and the full log. */
export function OrderRoute() {
  const { teamId = '', orderId = '' } = useParams();
  const { data: me } = useMe();
  const role = me?.teams.find((t) => t.teamId === teamId)?.role;
  const unit: LengthUnit = me?.user.unit ?? 'in';
  const { data: order, isError, error } = useOrder(teamId, orderId);
  if (isError)
    return (
      <p role="alert" className="font-bold text-alarm">
        {error.message}
      </p>
    );
  if (!order) return <p role="status">Opening the order…</p>;
  const money = (m: number | null) => (m === null ? '—' : formatMinor(m, order.currency));
  const editable = can(role, 'orders.quote') && EDITABLE_STATES.includes(order.state);

  return (
    <div>
      <Link to={`/t/${teamId}/orders`} className="text-sm font-bold text-ink-soft underline">
        All orders
      </Link>
      <PageTitle title={`Order ${order.number} · ${order.customer.name}`}>
        <p className="flex flex-wrap items-baseline gap-3">
          <span className="rounded-full bg-sage-light px-3 py-1 font-bold text-sage-deep" data-testid="order-state">
            {ORDER_STATE_LABELS[order.state]}
          </span>
          <span className="text-ink-soft">{order.customer.email}</span>
        </p>
      </PageTitle>
      {order.totalMinor !== null && (
        <dl
          className="mb-4 grid grid-cols-2 gap-2 rounded-sticker bg-paper-deep p-3 sm:grid-cols-3 lg:grid-cols-6"
          data-testid="order-money"
        >
          {(
            [
              ['Total', order.totalMinor],
              ['Paid', order.paidMinor],
              ['Still owed', order.dueMinor],
              ['Refunded', order.refundedMinor],
              ['Cost of runs', order.costMinor],
              ['Margin', order.marginMinor],
            ] as const
          ).map(([label, value]) => (
            <div key={label}>
              <dt className="text-sm font-bold text-ink-soft">{label}</dt>
              <dd className="text-lg font-extrabold text-ink">{money(value)}</dd>
            </div>
          ))}
        </dl>
      )}
      <div className="grid gap-4 lg:grid-cols-[2fr_1fr]">
        <div className="flex flex-col gap-4">
          <OrderLines teamId={teamId} order={order} unit={unit} editable={editable} />
          <Proofs order={order} unit={unit} />
        </div>
        <div className="flex flex-col gap-4">
          <OrderActions teamId={teamId} order={order} role={role} />
          <History order={order} money={money} />
        </div>
      </div>
    </div>
  );
}

function Proofs({ order, unit }: { order: OrderView; unit: LengthUnit }) {
  if (order.proofs.length === 0) return null;
  return (
    <section aria-labelledby="proofs-title" className="rounded-sticker border-2 border-paper-edge bg-white p-4">
      <h2 id="proofs-title" className="mb-2 text-xl font-extrabold text-ink">
        Proofs as sent
      </h2>
      <ol className="flex flex-col gap-3">
        {order.proofs.map((p) => (
          <li key={p.id} className="rounded-xl border-2 border-paper-edge p-3" data-testid="proof">
            <p className="font-bold text-ink">
              {PROOF_STATUS[p.status]} · sent {new Date(p.sentAt).toLocaleString()} to {p.sentTo}
            </p>
            {p.status === 'approved' && (
              <p className="text-sage-deep">
                Approved by “{p.decidedName}” on {new Date(p.decidedAt!).toLocaleString()}
              </p>
            )}
            {p.comment && <p className="text-ink">“{p.comment}”</p>}
            <ul className="mt-1 text-sm text-ink-soft">
              {p.lines.map((l, i) => (
                <li key={i} className="flex items-center gap-3">
                  {l.pictureUrl && (
                    <img src={l.pictureUrl} alt={`${l.title} as the buyer saw it`} className="h-16 w-16 rounded object-contain" />
                  )}
                  <span>
                    {l.quantity} × {l.title}
                    {l.finishedWidthMm !== null && l.finishedHeightMm !== null
                      ? `, ${formatLength(l.finishedWidthMm, unit)} × ${formatLength(l.finishedHeightMm, unit)}`
                      : ''}
                    {l.stockName ? `, on ${l.stockName}` : ''}
                    {l.totalMinor !== null ? `: ${formatMinor(l.totalMinor, order.currency)}` : ''}
                  </span>
                </li>
              ))}
            </ul>
          </li>
        ))}
      </ol>
    </section>
  );
}

function History({ order, money }: { order: OrderView; money: (m: number | null) => string }) {
  return (
    <section aria-labelledby="history-title" className="rounded-sticker border-2 border-paper-edge bg-white p-4">
      <h2 id="history-title" className="mb-2 text-xl font-extrabold text-ink">
        History
      </h2>
      {order.payments.length > 0 && (
        <ul className="mb-3 text-sm" aria-label="Payments">
          {order.payments.map((p) => (
            <li key={p.id}>
              {p.kind === 'refund' ? 'Refund' : p.kind === 'deposit' ? 'Deposit' : 'Balance'} {money(p.amountMinor)}:{' '}
              {{ open: 'asked', paid: 'paid', refunded: 'refunded', expired: 'not taken' }[p.status]}
            </li>
          ))}
        </ul>
      )}
      <ol className="flex flex-col gap-1 text-sm" data-testid="order-history">
        {[...order.events].reverse().map((e, i) => (
          <li key={i}>
            <span className="text-ink-faint">{new Date(e.at).toLocaleString()}</span> <span className="font-bold">{e.who}</span>: {e.what}
          </li>
        ))}
      </ol>
    </section>
  );
}
