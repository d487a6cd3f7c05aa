import { keepPreviousData, useQuery, useQueryClient } from '@tanstack/react-query';
import { formatMoney } from '@shared/production/cost';
import { costQueryOptions, machinesQueryOptions, shopApi, stockQueryOptions } from '@/api/shop';
import { useAction } from '@/hooks/use-action';

/** What one printed sheet costs, with every input shown, and the choices it is costed on. */
export function CostPanel({ teamId, sheetId, version, canEdit }: { teamId: string; sheetId: string; version: number; canEdit: boolean }) {
  const client = useQueryClient();
  // A saved edit makes a new version: keep showing the last figures (marked as updating) rather than blanking the panel.
  const cost = useQuery({ ...costQueryOptions(teamId, sheetId, version), placeholderData: keepPreviousData });
  const stock = useQuery(stockQueryOptions(teamId));
  const machines = useQuery(machinesQueryOptions(teamId));
  const { error, run } = useAction({ preferField: true });
  if (cost.isPending) return <p className="text-xs text-ink-faint">Working out the cost…</p>;
  if (!cost.data) return <p className="text-xs text-alarm">The cost could not be worked out.</p>;
  const { costing, inputs, cost: c, analysis, missing, priced, defaultsFrom } = cost.data;
  const money = (v: number) => formatMoney(v, inputs.currency);
  const choose = (patch: Partial<typeof costing>) =>
    void run(async () => {
      const fresh = await shopApi.setCosting(teamId, sheetId, { ...costing, ...patch });
      client.setQueryData(costQueryOptions(teamId, sheetId, version).queryKey, fresh);
      // The sheets table shows this cost too.
      void client.invalidateQueries({ queryKey: ['teams', teamId, 'sheets', 'list'] });
    });
  const select = (
    label: string,
    value: string | null,
    options: Array<{ id: string; name: string }>,
    key: 'stockId' | 'printerId' | 'cutterId',
  ) => (
    <label className="flex items-center justify-between gap-2">
      {label}
      <select
        value={value ?? ''}
        disabled={!canEdit}
        onChange={(e) => choose({ [key]: e.target.value || null })}
        className="w-32 rounded border-2 border-paper-edge px-1"
      >
        <option value="">None</option>
        {options.map((o) => (
          <option key={o.id} value={o.id}>
            {o.name}
          </option>
        ))}
      </select>
    </label>
  );
  const printers = (machines.data ?? []).filter((m) => m.kind === 'printer');
  const cutters = (machines.data ?? []).filter((m) => m.kind === 'cutter');
  return (
    <div className="mt-2 flex flex-col gap-1 text-xs" data-testid="cost-panel">
      {select('Stock', costing.stockId, stock.data ?? [], 'stockId')}
      {select('Printer', costing.printerId, printers, 'printerId')}
      {select('Cutter', costing.cutterId, cutters, 'cutterId')}
      <label className="flex items-center justify-between gap-2">
        Labour (min)
        <input
          type="number"
          min={0}
          max={600}
          step={1}
          defaultValue={costing.labourMinutes}
          disabled={!canEdit}
          onBlur={(e) => Number(e.target.value) !== costing.labourMinutes && choose({ labourMinutes: Number(e.target.value) })}
          className="w-16 rounded border-2 border-paper-edge px-1 text-right"
        />
      </label>
      {defaultsFrom && (
        <p className="text-ink-faint" data-testid="cost-defaults">
          {defaultsFrom === 'sheet-run'
            ? 'Costed on what this sheet’s last run used.'
            : defaultsFrom === 'team-default'
              ? 'Costed on the shop’s usual stock, printer and cutter.'
              : 'Costed on what the team’s last run used.'}{' '}
          Choose here to cost it on something else.
        </p>
      )}
      {!priced ? (
        <p className="mt-1 font-bold text-ink-soft" data-testid="cost-sheet">
          Not priced yet: choose a stock.
        </p>
      ) : (
        <table className="mt-1 w-full">
          <tbody>
            <tr>
              <td>Stock{inputs.stock ? ` (${money(inputs.stock.packPrice)} / ${inputs.stock.sheetsPerPack})` : ''}</td>
              <td className="text-right">{money(c.stock)}</td>
            </tr>
            <tr>
              <td>
                Ink ({Math.round(analysis.coverage.total * 100)} % coverage
                {inputs.printer ? ` × ${money(inputs.printer.inkFullPage)} a full page` : ''})
              </td>
              <td className="text-right">{money(c.ink)}</td>
            </tr>
            <tr>
              <td>
                Blade ({(analysis.cutLengthMm / 1000).toFixed(2)} m of cut{inputs.blade ? ` of ${inputs.blade.lifeM} m` : ''})
              </td>
              <td className="text-right">{money(c.blade)}</td>
            </tr>
            {inputs.wastePercent > 0 && (
              <tr>
                <td>Waste allowance ({inputs.wastePercent} % of the materials)</td>
                <td className="text-right">{money(c.waste)}</td>
              </tr>
            )}
            <tr>
              <td>Labour</td>
              <td className="text-right">{money(c.labour)}</td>
            </tr>
            <tr className="font-extrabold">
              <td>Per sheet</td>
              <td className="text-right" data-testid="cost-sheet">
                {money(c.sheet)}
              </td>
            </tr>
            <tr>
              <td>Per sticker ({analysis.pieces})</td>
              <td className="text-right">{c.perSticker === null ? '—' : money(c.perSticker)}</td>
            </tr>
            <tr className="text-sage-deep">
              <td>Price at {inputs.markupPercent} % markup</td>
              <td className="text-right">
                {money(c.suggestedSheet)}
                {c.suggestedSticker !== null ? ` · ${money(c.suggestedSticker)} each` : ''}
              </td>
            </tr>
          </tbody>
        </table>
      )}
      {cost.isError && <p className="text-alarm">These figures could not be brought up to date; they are from an earlier version.</p>}
      {cost.isPlaceholderData && <p className="text-ink-faint">Updating for the latest edit…</p>}
      {missing.length > 0 && <p className="text-ink-faint">Not counted yet: {missing.join(', ')}.</p>}
      {error && (
        <p role="alert" className="text-alarm">
          {error}
        </p>
      )}
    </div>
  );
}
