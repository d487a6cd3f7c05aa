import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { can } from '@shared/permissions';
import { formatMinor } from '@shared/orders/money';
import { ORDER_STATE_LABELS, ORDER_STATES } from '@shared/schemas/orders';
import type { OrderState, OrderSummary } from '@shared/schemas/orders';
import { PageTitle } from '@/components/page-title';
import { useMe } from '@/features/auth/api/me';
import { useQuery } from '@tanstack/react-query';
import { settingsQueryOptions } from '@/api/shop';
import { useOrderBoard } from '../api/orders';
import { NewOrder } from '../components/new-order';

/** The states a board column is kept for; handed-over and cancelled orders are found in the list. */
const BOARD_STATES: OrderState[] = ['quote', 'proof-out', 'changes', 'approved', 'deposit', 'paid', 'making', 'ready'];
const field = 'rounded-lg border-2 border-paper-edge bg-white px-3 py-2 text-ink focus:border-peel focus:outline-none';

const money = (o: Pick<OrderSummary, 'currency'>, minor: number | null) => (minor === null ? '—' : formatMinor(minor, o.currency));

/** Buyers' orders: a board by state and a list with filters, with the count and total per state. */
export function OrdersRoute() {
  const { teamId = '' } = useParams();
  const { data: me } = useMe();
  const role = me?.teams.find((t) => t.teamId === teamId)?.role;
  const [view, setView] = useState<'board' | 'list'>('board');
  const [state, setState] = useState('');
  const [q, setQ] = useState('');
  const [adding, setAdding] = useState(false);
  const board = useOrderBoard(teamId, { state, q });
  const orders = board.data?.orders ?? [];
  const totals = board.data?.totals;
  const link = (o: OrderSummary) => `/t/${teamId}/orders/${o.id}`;
  const currency = useQuery(settingsQueryOptions(teamId)).data?.currencyCode ?? 'USD';

  return (
    <div>
      <PageTitle title="Orders">
        {can(role, 'orders.quote') && !adding && (
          <button
            type="button"
            onClick={() => setAdding(true)}
            className="rounded-full bg-peel px-4 py-2 font-bold text-white hover:bg-peel-deep"
          >
            New quote
          </button>
        )}
      </PageTitle>
      <p className="-mt-4 mb-4 text-ink-soft">
        Buyers’ stickers from quote to hand-over: proofs they approve from a link, payments, and the sheets made for them.
      </p>
      {adding && <NewOrder teamId={teamId} onClose={() => setAdding(false)} />}
      <div className="mb-4 flex flex-wrap items-center gap-3" role="group" aria-label="Show orders">
        <div className="flex rounded-full border-2 border-paper-edge bg-white p-1" role="radiogroup" aria-label="Layout">
          {(['board', 'list'] as const).map((v) => (
            <button
              key={v}
              type="button"
              role="radio"
              aria-checked={view === v}
              onClick={() => setView(v)}
              className={`rounded-full px-3 py-1 font-bold ${view === v ? 'bg-ink text-paper' : 'text-ink'}`}
            >
              {v === 'board' ? 'By state' : 'List'}
            </button>
          ))}
        </div>
        <label className="flex items-center gap-2 font-bold text-ink">
          State
          <select className={field} value={state} onChange={(e) => setState(e.target.value)}>
            <option value="">Any</option>
            {ORDER_STATES.map((s) => (
              <option key={s} value={s}>
                {ORDER_STATE_LABELS[s]}
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-2 font-bold text-ink">
          Find
          <input className={field} value={q} onChange={(e) => setQ(e.target.value)} placeholder="Buyer, e-mail or #number" />
        </label>
      </div>
      {board.isError && (
        <p role="alert" className="font-bold text-alarm">
          The orders could not be loaded. Try again in a moment.
        </p>
      )}
      {view === 'board' ? (
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4" data-testid="order-board">
          {BOARD_STATES.filter((s) => !state || s === state).map((s) => (
            <section key={s} aria-label={ORDER_STATE_LABELS[s]} className="rounded-sticker border-2 border-paper-edge bg-paper-deep p-3">
              <h2 className="flex items-baseline justify-between font-extrabold text-ink">
                <span>{ORDER_STATE_LABELS[s]}</span>
                <span className="text-sm font-bold text-ink-soft">
                  {totals?.[s].count ?? 0}
                  {totals?.[s].count && totals[s].totalMinor !== null ? ` · ${money({ currency }, totals[s].totalMinor)}` : ''}
                </span>
              </h2>
              <ul className="mt-2 flex flex-col gap-2">
                {orders
                  .filter((o) => o.state === s)
                  .map((o) => (
                    <li key={o.id}>
                      <Link
                        to={link(o)}
                        className="block rounded-xl border-2 border-ink bg-white p-2 hover:bg-paper focus:outline-none focus-visible:ring-4 focus-visible:ring-peel"
                      >
                        <span className="block font-bold text-ink">
                          #{o.number} · {o.customer.name}
                        </span>
                        <span className="text-sm text-ink-soft">
                          {o.lines} line{o.lines === 1 ? '' : 's'} · {money(o, o.totalMinor)}
                        </span>
                      </Link>
                    </li>
                  ))}
              </ul>
            </section>
          ))}
        </div>
      ) : (
        <table className="w-full border-separate border-spacing-0 rounded-sticker bg-white text-left" data-testid="order-list">
          <thead>
            <tr className="text-sm text-ink-soft">
              {['Order', 'Buyer', 'State', 'Lines', 'Total', 'Paid', 'Changed'].map((h) => (
                <th key={h} scope="col" className="border-b-2 border-paper-edge px-3 py-2">
                  {h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {orders.map((o) => (
              <tr key={o.id} className="odd:bg-paper">
                <td className="px-3 py-2 font-bold">
                  <Link to={link(o)} className="text-ink underline">
                    #{o.number}
                  </Link>
                </td>
                <td className="px-3 py-2">{o.customer.name}</td>
                <td className="px-3 py-2">{ORDER_STATE_LABELS[o.state]}</td>
                <td className="px-3 py-2">{o.lines}</td>
                <td className="px-3 py-2">{money(o, o.totalMinor)}</td>
                <td className="px-3 py-2">{money(o, o.paidMinor)}</td>
                <td className="px-3 py-2">{new Date(o.updatedAt).toLocaleDateString()}</td>
              </tr>
            ))}
            {orders.length === 0 && (
              <tr>
                <td colSpan={7} className="px-3 py-6 text-center text-ink-soft">
                  No orders here yet.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      )}
    </div>
  );
}
