import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { RUN_RESULT_LABELS, RUN_RESULTS } from '../../../../shared/schemas/shop';
import type { PrintRunView, StockView } from '../../../../shared/schemas/shop';
import { runsQueryOptions, sheetChoicesQueryOptions, shopApi, shopKeys, useMachines, useStock } from '../../../api/shop';
import { ApiError, apiUpload } from '../../../lib/api-client';
import { useAction } from '../../../hooks/use-action';
import { cutterSettingsText, printerSettingsText } from '../settings-text';

const input = 'rounded border-2 border-paper-edge px-2 py-1';

/** Cut length and wasted sheets per week, as bars: what the blade has been through and what went in the bin. */
function RunChart({ runs }: { runs: PrintRunView[] }) {
  const weeks = new Map<string, { cut: number; wasted: number }>();
  for (const r of runs) {
    const d = new Date(`${r.printedOn}T00:00:00Z`);
    d.setUTCDate(d.getUTCDate() - ((d.getUTCDay() + 6) % 7)); // the Monday of its week
    const key = d.toISOString().slice(0, 10);
    const w = weeks.get(key) ?? { cut: 0, wasted: 0 };
    weeks.set(key, { cut: w.cut + r.cutLengthM, wasted: w.wasted + r.wasted });
  }
  const rows = [...weeks].sort(([a], [b]) => a.localeCompare(b)).slice(-12);
  if (rows.length === 0) return null;
  const maxCut = Math.max(...rows.map(([, w]) => w.cut), 0.001),
    maxWaste = Math.max(...rows.map(([, w]) => w.wasted), 1);
  const bar = 40,
    h = 90;
  return (
    <figure className="mb-3" aria-label="Cut length and wasted sheets by week">
      <svg
        width={rows.length * bar + 10}
        height={h + 30}
        role="img"
        aria-label={`Bars for ${rows.length} week${rows.length === 1 ? '' : 's'}: metres cut and sheets wasted`}
        data-testid="run-chart"
      >
        {rows.map(([week, w], i) => (
          <g key={week} transform={`translate(${5 + i * bar},0)`}>
            <rect x={4} y={h - (h * w.cut) / maxCut} width={14} height={(h * w.cut) / maxCut} className="fill-sage">
              <title>{`${week}: ${w.cut.toFixed(1)} m cut`}</title>
            </rect>
            <rect x={20} y={h - (h * w.wasted) / maxWaste} width={14} height={(h * w.wasted) / maxWaste} className="fill-alarm">
              <title>{`${week}: ${w.wasted} sheets wasted`}</title>
            </rect>
            <text x={2} y={h + 14} fontSize={9}>
              {week.slice(5)}
            </text>
          </g>
        ))}
      </svg>
      <figcaption className="text-xs text-ink-soft">
        <span className="text-sage-deep">■</span> metres cut · <span className="text-alarm">■</span> sheets wasted, per week (up to{' '}
        {maxCut.toFixed(1)} m and {maxWaste} sheets)
      </figcaption>
    </figure>
  );
}

/** Record a print run and read the history: filters, chart and table. */
export function RunLog({ teamId, canRecord }: { teamId: string; canRecord: boolean }) {
  const client = useQueryClient();
  const stock = useStock(teamId);
  const machines = useMachines(teamId);
  const sheets = useQuery(sheetChoicesQueryOptions(teamId));
  const [filters, setFilters] = useState({ result: '', stockId: '', cutterId: '', from: '', to: '' });
  const runs = useQuery(runsQueryOptions(teamId, filters));
  const blankRun = { sheetId: '', copies: '1', wasted: '', printedOn: '', result: 'good', notes: '' };
  const [form, setForm] = useState({ ...blankRun, stockId: '', printerId: '', cutterId: '' });
  // A new key empties the photo input after a run is logged (a file input cannot be set from code).
  const [photoKey, setPhotoKey] = useState(0);
  // What the printer and cutter were set to: the stock's settings that worked, changed where this run differed.
  const [used, setUsed] = useState<Pick<StockView, 'printerSettings' | 'cutterSettings'> | null>(null);
  const chooseStock = (stockId: string) => {
    const s = stock.data?.find((x) => x.id === stockId);
    setForm({ ...form, stockId });
    setUsed(s ? { printerSettings: s.printerSettings, cutterSettings: s.cutterSettings } : null);
  };
  const setting = (group: 'printerSettings' | 'cutterSettings', key: string, label: string, w = 'w-28') =>
    used && (
      <label className="flex flex-col text-xs font-bold">
        {label}
        <input
          value={String((used[group] as Record<string, unknown>)[key] ?? '')}
          onChange={(e) => setUsed({ ...used, [group]: { ...used[group], [key]: e.target.value } })}
          className={`${input} ${w} font-normal`}
        />
      </label>
    );
  const [photo, setPhoto] = useState<File | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const { error, busy, run } = useAction({ preferField: true });
  const printers = (machines.data ?? []).filter((m) => m.kind === 'printer');
  const cutters = (machines.data ?? []).filter((m) => m.kind === 'cutter');
  const pick = (key: keyof typeof form, label: string, options: Array<{ id: string; name: string }>, none = 'None') => (
    <label className="flex flex-col text-xs font-bold">
      {label}
      <select
        value={form[key]}
        onChange={(e) => (key === 'stockId' ? chooseStock(e.target.value) : setForm({ ...form, [key]: e.target.value }))}
        className={`${input} font-normal`}
      >
        <option value="">{none}</option>
        {options.map((o) => (
          <option key={o.id} value={o.id}>
            {o.name}
          </option>
        ))}
      </select>
    </label>
  );
  const record = () =>
    run(async () => {
      setDone(null);
      const body = {
        sheetId: form.sheetId,
        copies: form.copies,
        stockId: form.stockId,
        printerId: form.printerId || null,
        cutterId: form.cutterId || null,
        result: form.result,
        notes: form.notes,
        ...(form.wasted !== '' && { wasted: form.wasted }),
        ...(form.printedOn !== '' && { printedOn: form.printedOn }),
        ...(used && { printerSettings: used.printerSettings, cutterSettings: used.cutterSettings }),
      };
      let saved: PrintRunView;
      try {
        saved = await shopApi.recordRun(teamId, body);
      } catch (e) {
        if (!(e instanceof ApiError && e.code === 'stock_short' && window.confirm(e.message))) throw e;
        saved = await shopApi.recordRun(teamId, { ...body, confirmNegativeStock: true });
      }
      if (photo) {
        const data = new FormData();
        data.append('photo', photo);
        await apiUpload(`/teams/${teamId}/print-runs/${saved.id}/photo`, data);
      }
      setDone(`Logged: ${saved.copies} × ${saved.sheet.name}, ${saved.cutLengthM.toFixed(2)} m of cut.`);
      // The next run starts blank but for the stock and machines, which usually stay: pressing Log
      // run again cannot log this run a second time, it asks for a sheet.
      setForm((current) => ({ ...current, ...blankRun }));
      setPhoto(null);
      setPhotoKey((k) => k + 1);
      await client.invalidateQueries({ queryKey: shopKeys.all(teamId) });
    });
  const filter = (key: keyof typeof filters, label: string, options: Array<{ id: string; name: string }>) => (
    <select aria-label={label} value={filters[key]} onChange={(e) => setFilters({ ...filters, [key]: e.target.value })} className={input}>
      <option value="">{label}: any</option>
      {options.map((o) => (
        <option key={o.id} value={o.id}>
          {o.name}
        </option>
      ))}
    </select>
  );
  return (
    <section aria-labelledby="runs-title" className="rounded-sticker border-2 border-paper-edge bg-white p-4 text-sm">
      <h2 id="runs-title" className="mb-2 text-lg font-extrabold">
        Run log
      </h2>
      {canRecord && (
        <form
          className="mb-4 flex flex-wrap items-end gap-2 rounded-lg bg-paper p-3"
          onSubmit={(e) => {
            e.preventDefault();
            void record();
          }}
          aria-label="Log a print run"
        >
          {pick(
            'sheetId',
            'Sheet',
            (sheets.data ?? []).map((s) => ({ id: s.id, name: s.name })),
            'Choose…',
          )}
          <label className="flex flex-col text-xs font-bold">
            Copies
            <input
              value={form.copies}
              onChange={(e) => setForm({ ...form, copies: e.target.value })}
              className={`${input} w-16 font-normal`}
              inputMode="numeric"
            />
          </label>
          <label className="flex flex-col text-xs font-bold">
            Wasted
            <input
              value={form.wasted}
              placeholder={form.result === 'good' ? '0' : 'all'}
              onChange={(e) => setForm({ ...form, wasted: e.target.value })}
              className={`${input} w-14 font-normal`}
              inputMode="numeric"
            />
          </label>
          {pick('stockId', 'Stock', stock.data ?? [], 'Choose…')}
          {pick('printerId', 'Printer', printers)}
          {pick('cutterId', 'Cutter', cutters)}
          <label className="flex flex-col text-xs font-bold">
            Result
            <select value={form.result} onChange={(e) => setForm({ ...form, result: e.target.value })} className={`${input} font-normal`}>
              {RUN_RESULTS.map((r) => (
                <option key={r} value={r}>
                  {RUN_RESULT_LABELS[r]}
                </option>
              ))}
            </select>
          </label>
          <label className="flex flex-col text-xs font-bold">
            Notes
            <input
              value={form.notes}
              onChange={(e) => setForm({ ...form, notes: e.target.value })}
              className={`${input} w-48 font-normal`}
            />
          </label>
          <label className="flex flex-col text-xs font-bold">
            Photo (optional)
            <input
              key={photoKey}
              type="file"
              accept="image/*"
              onChange={(e) => setPhoto(e.target.files?.[0] ?? null)}
              className="text-xs font-normal"
            />
          </label>
          <label className="flex flex-col text-xs font-bold">
            Printed on
            <input
              type="date"
              value={form.printedOn}
              onChange={(e) => setForm({ ...form, printedOn: e.target.value })}
              className={`${input} font-normal`}
            />
          </label>
          <button type="submit" disabled={busy} className="rounded-full bg-ink px-4 py-1 font-bold text-paper disabled:opacity-60">
            {busy ? 'Logging…' : 'Log run'}
          </button>
          {used && (
            <details className="w-full text-xs">
              <summary className="cursor-pointer font-bold">Settings used (from the stock; change what differed on this run)</summary>
              <div className="mt-1 flex flex-wrap items-end gap-2">
                {setting('printerSettings', 'paperSetting', 'Paper setting')}
                {setting('printerSettings', 'quality', 'Quality')}
                {setting('printerSettings', 'colour', 'Colour')}
                {setting('cutterSettings', 'material', 'Material setting')}
                {setting('cutterSettings', 'pressure', 'Pressure', 'w-16')}
                {setting('cutterSettings', 'passes', 'Passes', 'w-12')}
                {setting('cutterSettings', 'blade', 'Blade')}
              </div>
            </details>
          )}
          <p className="w-full text-xs text-ink-faint">
            The run takes its copies from the stock on hand and adds the sheet's cut length × copies to the cutter's fitted blade. Wasted
            sheets count as none for a good run and all copies otherwise unless you give a number; the date is today unless you pick one.
          </p>
        </form>
      )}
      {done && (
        <p role="status" className="mb-2 font-semibold text-sage-deep" data-testid="run-logged">
          {done}
        </p>
      )}
      {error && (
        <p role="alert" className="mb-2 font-semibold text-alarm">
          {error}
        </p>
      )}
      <div className="mb-2 flex flex-wrap gap-2 text-xs">
        <select
          aria-label="Result"
          value={filters.result}
          onChange={(e) => setFilters({ ...filters, result: e.target.value })}
          className={input}
        >
          <option value="">Result: any</option>
          {RUN_RESULTS.map((r) => (
            <option key={r} value={r}>
              {RUN_RESULT_LABELS[r]}
            </option>
          ))}
        </select>
        {filter('stockId', 'Stock', stock.data ?? [])}
        {filter('cutterId', 'Cutter', cutters)}
        <label className="flex items-center gap-1">
          From
          <input type="date" value={filters.from} onChange={(e) => setFilters({ ...filters, from: e.target.value })} className={input} />
        </label>
        <label className="flex items-center gap-1">
          To
          <input type="date" value={filters.to} onChange={(e) => setFilters({ ...filters, to: e.target.value })} className={input} />
        </label>
      </div>
      <RunChart runs={runs.data ?? []} />
      <table className="w-full text-xs [&_td]:pr-3 [&_th]:pr-3" data-testid="runs-table">
        <thead className="text-left text-ink-soft">
          <tr>
            <th>Date</th>
            <th>Sheet</th>
            <th>Copies</th>
            <th>Wasted</th>
            <th>Stock</th>
            <th>Cutter / blade</th>
            <th>Cut</th>
            <th>Result</th>
            <th>Notes</th>
            <th>By</th>
          </tr>
        </thead>
        <tbody>
          {runs.data?.map((r) => (
            <tr key={r.id} className="border-t border-paper-deep">
              <td className="whitespace-nowrap py-1">{r.printedOn}</td>
              <td>
                {r.sheet.name} <span className="text-ink-faint">v{r.sheet.version}</span>
              </td>
              <td>{r.copies}</td>
              <td>{r.wasted}</td>
              <td>{r.stock?.name ?? '—'}</td>
              <td>{r.cutter ? `${r.cutter.name}${r.blade ? ` / ${r.blade.label}` : ''}` : '—'}</td>
              <td className="whitespace-nowrap">{r.cutLengthM.toFixed(2)} m</td>
              <td className={r.result === 'good' ? 'text-sage-deep' : 'font-bold text-alarm'}>{RUN_RESULT_LABELS[r.result]}</td>
              <td>
                {r.notes}
                {r.photoUrl && (
                  <>
                    {' '}
                    <a href={r.photoUrl} className="underline" target="_blank" rel="noreferrer">
                      photo
                    </a>
                  </>
                )}
                <details>
                  <summary className="cursor-pointer text-ink-faint">settings</summary>
                  {[printerSettingsText(r.printerSettings), cutterSettingsText(r.cutterSettings)].filter(Boolean).join(' · ')}
                </details>
              </td>
              <td>{r.by}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {runs.data?.length === 0 && <p className="mt-2 text-ink-faint">No runs match.</p>}
    </section>
  );
}
