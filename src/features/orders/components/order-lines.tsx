import { useId, useState } from 'react';
import type { ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { formatMinor } from '@shared/orders/money';
import type { OrderView } from '@shared/schemas/orders';
import type { LengthUnit } from '@shared/units';
import { formatLength, parseLength } from '@shared/units';
import { ApiError } from '@/lib/api-client';
import { useQuery } from '@tanstack/react-query';
import { sheetChoicesQueryOptions, useStock } from '@/api/shop';
import { ordersApi, useArtChoices, useOrderChange } from '../api/orders';

const input = 'w-full rounded-lg border-2 border-paper-edge bg-white px-3 py-2 font-normal text-ink focus:border-peel focus:outline-none';

/** A label tied to its control by id, so the control's name is the label alone. */
function Field({ label, children, error }: { label: string; children: (id: string) => ReactNode; error?: ReactNode }) {
  const id = useId();
  return (
    <div className="text-sm font-bold text-ink">
      <label htmlFor={id}>{label}</label>
      {children(id)}
      {error}
    </div>
  );
}

type LineDraft = {
  kind: 'singles' | 'sheet';
  artId: string;
  sheetId: string;
  size: string;
  quantity: string;
  stockId: string;
  price: string;
};

/** The order's lines; while it is a quote, prices can be typed over and lines added or taken off. */
export function OrderLines({ teamId, order, unit, editable }: { teamId: string; order: OrderView; unit: LengthUnit; editable: boolean }) {
  const money = (m: number | null) => (m === null ? '—' : formatMinor(m, order.currency));
  const setPrice = useOrderChange(teamId, order.id, (v: { lineId: string; price: string }) =>
    ordersApi.setPrice(teamId, order.id, v.lineId, v.price),
  );
  const remove = useOrderChange(teamId, order.id, (lineId: string) => ordersApi.removeLine(teamId, order.id, lineId));
  const [priceError, setPriceError] = useState<string | null>(null);
  return (
    <section aria-labelledby="lines-title" className="rounded-sticker border-2 border-paper-edge bg-white p-4">
      <h2 id="lines-title" className="mb-2 text-xl font-extrabold text-ink">
        Stickers
      </h2>
      <table className="w-full text-left">
        <thead>
          <tr className="text-sm text-ink-soft">
            {['What', 'Finished size', 'Qty', 'Stock', 'Each', 'Line', ''].map((h, i) => (
              <th key={i} scope="col" className="border-b-2 border-paper-edge px-2 py-1">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {order.lines.map((l) => (
            <tr key={l.id} className="align-top">
              <td className="px-2 py-2 font-bold text-ink">
                {l.title}
                <span className="block text-xs font-normal text-ink-faint">
                  {l.kind === 'singles' ? 'Die-cut singles' : 'Printed sheets'}
                </span>
              </td>
              <td className="px-2 py-2">{l.finishedWidthMm === null ? '—' : `${formatLength(l.finishedWidthMm, unit)} wide`}</td>
              <td className="px-2 py-2">{l.quantity}</td>
              <td className="px-2 py-2">{l.stockName ?? '—'}</td>
              <td className="px-2 py-2">
                {editable && l.unitPriceMinor !== null ? (
                  <input
                    aria-label={`Price each of ${l.title}`}
                    defaultValue={(l.unitPriceMinor / 100).toFixed(2)}
                    className="w-24 rounded border-2 border-paper-edge px-2 py-1"
                    onBlur={(e) => {
                      const typed = e.target.value.trim();
                      if (typed === (l.unitPriceMinor! / 100).toFixed(2)) return;
                      setPriceError(null);
                      setPrice.mutate(
                        { lineId: l.id, price: typed },
                        {
                          onError: (err) =>
                            setPriceError(err instanceof ApiError ? (Object.values(err.fields)[0] ?? err.message) : 'That did not work.'),
                        },
                      );
                    }}
                  />
                ) : (
                  money(l.unitPriceMinor)
                )}
                {l.priceFrom && (
                  <span className="block text-xs text-ink-faint">{l.priceFrom === 'cost' ? 'from the cost model' : 'typed'}</span>
                )}
              </td>
              <td className="px-2 py-2 font-bold">{money(l.totalMinor)}</td>
              <td className="px-2 py-2">
                {editable && (
                  <button
                    type="button"
                    onClick={() => remove.mutate(l.id)}
                    className="rounded-full border-2 border-paper-edge px-2 py-0.5 text-sm font-bold text-ink"
                  >
                    Take off
                  </button>
                )}
              </td>
            </tr>
          ))}
          {order.lines.length === 0 && (
            <tr>
              <td colSpan={7} className="px-2 py-4 text-ink-soft">
                No stickers yet: add what the buyer wants below.
              </td>
            </tr>
          )}
        </tbody>
      </table>
      {priceError && (
        <p role="alert" className="mt-2 font-bold text-alarm">
          {priceError}
        </p>
      )}
      <p className="mt-2 text-right text-lg font-extrabold text-ink">Total {money(order.totalMinor)}</p>
      {editable && <AddLine teamId={teamId} order={order} unit={unit} />}
    </section>
  );
}

function AddLine({ teamId, order, unit }: { teamId: string; order: OrderView; unit: LengthUnit }) {
  const id = useId();
  const [search, setSearch] = useState('');
  const art = useArtChoices(teamId, search);
  const sheets = useQuery(sheetChoicesQueryOptions(teamId));
  const stock = useStock(teamId);
  const form = useForm<LineDraft>({
    defaultValues: { kind: 'singles', artId: '', sheetId: '', size: unit === 'in' ? '3' : '75', quantity: '50', stockId: '', price: '' },
  });
  const kind = form.watch('kind');
  const add = useOrderChange(teamId, order.id, (body: object) => ordersApi.addLine(teamId, order.id, body));
  const errors = form.formState.errors;
  const onSubmit = form.handleSubmit(async (d) => {
    const size = parseLength(d.size, unit);
    if (d.kind === 'singles' && size === null)
      return form.setError('size', { message: `Give the finished width, like ${unit === 'in' ? '3 in' : '75 mm'}` });
    const body =
      d.kind === 'singles'
        ? { kind: 'singles', artId: d.artId, finishedWidthMm: size, quantity: d.quantity, stockId: d.stockId || null }
        : { kind: 'sheet', sheetId: d.sheetId, quantity: d.quantity, stockId: d.stockId || null };
    try {
      await add.mutateAsync({ ...body, ...(d.price.trim() ? { unitPrice: d.price.trim() } : {}) });
      form.reset({ ...d, price: '' });
    } catch (e) {
      const map: Record<string, keyof LineDraft> = {
        finishedWidthMm: 'size',
        unitPrice: 'price',
        artId: 'artId',
        sheetId: 'sheetId',
        quantity: 'quantity',
        stockId: 'stockId',
      };
      if (e instanceof ApiError) {
        const fields = Object.entries(e.fields);
        for (const [f, message] of fields) form.setError(map[f] ?? 'root', { message });
        if (fields.length === 0) form.setError('root', { message: e.message });
      } else form.setError('root', { message: 'That did not work. Try again.' });
    }
  });
  const err = (name: keyof LineDraft) =>
    errors[name] && (
      <span role="alert" className="block text-sm text-alarm">
        {errors[name]?.message}
      </span>
    );
  return (
    <form
      onSubmit={onSubmit}
      className="mt-4 rounded-xl border-2 border-dashed border-paper-edge p-3"
      aria-labelledby={`${id}-t`}
      noValidate
    >
      <h3 id={`${id}-t`} className="mb-2 font-extrabold text-ink">
        Add stickers
      </h3>
      <fieldset className="mb-2 flex gap-4">
        <legend className="sr-only">Kind</legend>
        <label className="flex items-center gap-1 font-bold">
          <input type="radio" value="singles" {...form.register('kind')} /> Die-cut singles of one art
        </label>
        <label className="flex items-center gap-1 font-bold">
          <input type="radio" value="sheet" {...form.register('kind')} /> Copies of a sheet
        </label>
      </fieldset>
      <div className="grid gap-3 md:grid-cols-3">
        {kind === 'singles' ? (
          <>
            <Field label="Find art">
              {(id) => (
                <input id={id} className={input} value={search} onChange={(e) => setSearch(e.target.value)} placeholder="Name or keyword" />
              )}
            </Field>
            <Field label="Art" error={err('artId')}>
              {(id) => (
                <select id={id} className={input} {...form.register('artId', { required: 'Pick the art' })}>
                  <option value="">Pick…</option>
                  {(art.data ?? []).map((a) => (
                    <option key={a.id} value={a.id}>
                      {a.name}
                    </option>
                  ))}
                </select>
              )}
            </Field>
            <Field label={`Finished width, border included (${unit})`} error={err('size')}>
              {(id) => <input id={id} className={input} inputMode="decimal" {...form.register('size')} />}
            </Field>
          </>
        ) : (
          <Field label="Sheet" error={err('sheetId')}>
            {(id) => (
              <select id={id} className={input} {...form.register('sheetId', { required: 'Pick the sheet' })}>
                <option value="">Pick…</option>
                {(sheets.data ?? []).map((s) => (
                  <option key={s.id} value={s.id}>
                    {s.name}
                  </option>
                ))}
              </select>
            )}
          </Field>
        )}
        <Field label={kind === 'singles' ? 'How many' : 'Copies'} error={err('quantity')}>
          {(id) => <input id={id} className={input} inputMode="numeric" {...form.register('quantity')} />}
        </Field>
        <Field label="Stock" error={err('stockId')}>
          {(id) => (
            <select id={id} className={input} {...form.register('stockId')}>
              <option value="">The shop’s usual stock</option>
              {(stock.data ?? []).map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Price each (leave empty to price from the cost model)" error={err('price')}>
          {(id) => <input id={id} className={input} inputMode="decimal" {...form.register('price')} />}
        </Field>
      </div>
      {errors.root && (
        <p role="alert" className="mt-2 font-bold text-alarm">
          {errors.root.message}
        </p>
      )}
      <button type="submit" disabled={form.formState.isSubmitting} className="mt-3 rounded-full bg-ink px-4 py-2 font-bold text-paper">
        Add to the order
      </button>
    </form>
  );
}
