import { useQueryClient } from '@tanstack/react-query';
import { Fragment, useState } from 'react';
import { FINISH_LABELS } from '@shared/schemas/shop';
import type { StockView } from '@shared/schemas/shop';
import { formatMoney } from '@shared/production/cost';
import type { LengthUnit } from '@shared/units';
import { formatLength } from '@shared/units';
import { shopApi, shopKeys, useStock } from '@/api/shop';
import { useAction } from '@/hooks/use-action';
import { cutterSettingsText, printerSettingsText } from '../settings-text';
import { StockForm } from './stock-form';

const small = 'rounded border-2 border-paper-edge px-2 font-bold';

/** Everything the shelf keeps on one stock, for the row's settings disclosure. */
function StockSettings({ s, unit }: { s: StockView; unit: LengthUnit }) {
  const line = (label: string, text: string) => (
    <p>
      <strong>{label}:</strong> {text || <span className="text-ink-faint">not noted</span>}
    </p>
  );
  return (
    <div className="text-xs">
      {line(
        'Paper',
        s.paper === 'custom'
          ? `${formatLength(s.paperWidthMm, unit)} × ${formatLength(s.paperHeightMm, unit)}`
          : s.paper === 'a4'
            ? 'A4'
            : 'Letter',
      )}
      {line('Printer', printerSettingsText(s.printerSettings))}
      {line('Cutter', cutterSettingsText(s.cutterSettings))}
      {s.notes && (
        <p>
          <strong>Notes:</strong> {s.notes}
        </p>
      )}
    </div>
  );
}

/** The team's stock: cost per sheet, sheets on hand, and the printer and cutter settings that worked. */
export function StockShelf({
  teamId,
  currency,
  unit,
  canManage,
  canRecord,
}: {
  teamId: string;
  currency: string;
  unit: LengthUnit;
  canManage: boolean;
  canRecord: boolean;
}) {
  const client = useQueryClient();
  const stock = useStock(teamId);
  const { error, run } = useAction();
  const [editing, setEditing] = useState<string | null>(null);
  const [adding, setAdding] = useState(false);
  const [open, setOpen] = useState<string | null>(null);
  const refresh = () => client.invalidateQueries({ queryKey: shopKeys.all(teamId) });
  const adjust = (s: StockView, change: number) =>
    run(async () => {
      try {
        await shopApi.adjustStock(teamId, s.id, change);
      } catch (e) {
        if ((e as { code?: string }).code !== 'stock_short' || !window.confirm(`${(e as Error).message}`)) throw e;
        await shopApi.adjustStock(teamId, s.id, change, true);
      }
      await refresh();
    });
  const archive = (s: StockView) =>
    run(async () => {
      if (!window.confirm(`Take ${s.name} off the shelf? Runs already logged on it keep its name; sheets costed on it keep its price.`))
        return;
      await shopApi.archiveStock(teamId, s.id);
      await refresh();
    });
  return (
    <section aria-labelledby="stock-title" className="rounded-sticker border-2 border-paper-edge bg-white p-4 text-sm">
      <h2 id="stock-title" className="mb-1 text-lg font-extrabold">
        Stock shelf
      </h2>
      <p className="mb-2 text-xs text-ink-soft">
        Inkjet sticker paper is not food-safe or skin-safe unless its maker says so: check the pack before using it on food, cups or skin.
      </p>
      <table className="w-full [&_td]:pr-2" data-testid="stock-table">
        <thead className="text-left text-xs text-ink-soft">
          <tr>
            <th>Name</th>
            <th>Finish</th>
            <th>Per sheet</th>
            <th>On hand</th>
            <th>Cutter setting</th>
            <th>Rating</th>
            <th>
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {stock.data?.map((s) => (
            <Fragment key={s.id}>
              <tr className="border-t border-paper-deep align-top" data-testid={`stock-${s.id}`}>
                <td className="py-1 font-bold">
                  {s.name}
                  {(s.foodSafe || s.skinSafe) && (
                    <span className="ml-1 rounded-full bg-sage-light px-2 text-xs text-sage-deep">
                      {[s.foodSafe && 'food-safe', s.skinSafe && 'skin-safe'].filter(Boolean).join(', ')}
                    </span>
                  )}
                </td>
                <td>{FINISH_LABELS[s.finish]}</td>
                <td>
                  {formatMoney(s.costPerSheet, currency)}{' '}
                  <span className="text-xs text-ink-faint">
                    ({formatMoney(s.packPrice, currency)} / {s.sheetsPerPack})
                  </span>
                </td>
                <td data-testid="on-hand" className={s.onHand < 0 ? 'font-bold text-alarm' : s.low ? 'font-bold text-peel-deep' : ''}>
                  {s.onHand}
                  {s.low && <span className="ml-1 text-xs">(running low: {s.lowAt} or fewer)</span>}
                </td>
                <td className="text-xs">
                  <button
                    type="button"
                    className="text-left underline decoration-dotted"
                    aria-expanded={open === s.id}
                    aria-controls={`stock-settings-${s.id}`}
                    onClick={() => setOpen(open === s.id ? null : s.id)}
                  >
                    {[s.cutterSettings.material, s.cutterSettings.pressure && `pressure ${s.cutterSettings.pressure}`]
                      .filter(Boolean)
                      .join(' · ') || 'Show settings'}
                  </button>
                </td>
                <td>
                  <span aria-label={s.rating ? `${s.rating} of 5` : 'not rated'}>{s.rating ? '★'.repeat(s.rating) : '—'}</span>
                </td>
                <td>
                  <div className="flex flex-wrap justify-end gap-1">
                    {canRecord && (
                      <>
                        <button
                          type="button"
                          className={small}
                          onClick={() => {
                            const n = Number(window.prompt('Sheets added (a delivery):', '25'));
                            if (n > 0) void adjust(s, n);
                          }}
                        >
                          Add sheets
                        </button>
                        <button
                          type="button"
                          className={small}
                          onClick={() => {
                            const n = Number(window.prompt('Sheets to take off (spoiled, counted short):', '1'));
                            if (n > 0) void adjust(s, -n);
                          }}
                        >
                          Take off
                        </button>
                      </>
                    )}
                    {canManage && (
                      <>
                        <button
                          type="button"
                          className={small}
                          aria-expanded={editing === s.id}
                          onClick={() => setEditing(editing === s.id ? null : s.id)}
                        >
                          Edit<span className="sr-only"> {s.name}</span>
                        </button>
                        <button type="button" className={small} onClick={() => void archive(s)}>
                          Retire<span className="sr-only"> {s.name}</span>
                        </button>
                      </>
                    )}
                  </div>
                </td>
              </tr>
              {open === s.id && (
                <tr id={`stock-settings-${s.id}`} data-testid="stock-settings">
                  <td colSpan={7} className="pb-2 pl-4">
                    <StockSettings s={s} unit={unit} />
                  </td>
                </tr>
              )}
              {editing === s.id && (
                <tr>
                  <td colSpan={7} className="pb-2">
                    <StockForm
                      stock={s}
                      currency={currency}
                      unit={unit}
                      onCancel={() => setEditing(null)}
                      onSave={async (body) => {
                        await shopApi.updateStock(teamId, s.id, body);
                        setEditing(null);
                        await refresh();
                      }}
                    />
                  </td>
                </tr>
              )}
            </Fragment>
          ))}
        </tbody>
      </table>
      {stock.data?.length === 0 && (
        <p className="py-2 text-ink-soft">No stock yet{canManage ? ': add the sticker paper you print on below.' : '.'}</p>
      )}
      {canManage && (
        <div className="mt-3 border-t border-paper-deep pt-3">
          {adding ? (
            <StockForm
              currency={currency}
              unit={unit}
              onCancel={() => setAdding(false)}
              onSave={async (body) => {
                await shopApi.createStock(teamId, body);
                setAdding(false);
                await refresh();
              }}
            />
          ) : (
            <button type="button" className="rounded-full bg-ink px-4 py-1 font-bold text-paper" onClick={() => setAdding(true)}>
              New stock…
            </button>
          )}
        </div>
      )}
      {error && (
        <p role="alert" className="mt-2 font-semibold text-alarm">
          {error}
        </p>
      )}
    </section>
  );
}
