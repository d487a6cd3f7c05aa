import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { RUN_RESULT_LABELS, RUN_RESULTS } from '@shared/schemas/shop';
import type { PrintRunView, StockView } from '@shared/schemas/shop';
import { openOrdersQueryOptions, runsQueryOptions, sheetChoicesQueryOptions, shopApi, shopKeys, useMachines, useStock } from '@/api/shop';
import { ApiError, apiUpload } from '@/lib/api-client';
import { useAction } from '@/hooks/use-action';
import { RunChart } from './run-chart';
import { RunsTable } from './runs-table';

const input = 'rounded border-2 border-paper-edge px-2 py-1';

/** Record a print run and read the history: filters, chart and table. */
export function RunLog({ teamId, canRecord }: { teamId: string; canRecord: boolean }) {
  const client = useQueryClient();
  const stock = useStock(teamId);
  const machines = useMachines(teamId);
  const sheets = useQuery(sheetChoicesQueryOptions(teamId));
  const orders = useQuery(openOrdersQueryOptions(teamId));
  const [filters, setFilters] = useState({ result: '', stockId: '', cutterId: '', from: '', to: '' });
  const runs = useQuery(runsQueryOptions(teamId, filters));
  const blankRun = { sheetId: '', copies: '1', wasted: '', printedOn: '', result: 'good', notes: '' };
  // The run as typed lives in react-hook-form (the server validates it and names a bad field).
  const rhf = useForm({ defaultValues: { ...blankRun, stockId: '', printerId: '', cutterId: '', orderId: '' } });
  const form = rhf.watch();
  // A new key empties the photo input after a run is logged (a file input cannot be set from code).
  const [photoKey, setPhotoKey] = useState(0);
  // What the printer and cutter were set to: the stock's settings that worked, changed where this run differed.
  const [used, setUsed] = useState<Pick<StockView, 'printerSettings' | 'cutterSettings'> | null>(null);
  const chooseStock = (stockId: string) => {
    const s = stock.data?.find((x) => x.id === stockId);
    rhf.setValue('stockId', stockId);
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
        onChange={(e) => (key === 'stockId' ? chooseStock(e.target.value) : rhf.setValue(key, e.target.value))}
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
        orderId: form.orderId || null,
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
      rhf.reset({ ...rhf.getValues(), ...blankRun });
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
          onSubmit={rhf.handleSubmit(() => void record())}
          aria-label="Log a print run"
        >
          {pick(
            'sheetId',
            'Sheet',
            (sheets.data ?? []).map((s) => ({ id: s.id, name: s.name })),
            'Choose…',
          )}
          {pick('orderId', 'For order', orders.data ?? [], 'No order')}
          <label className="flex flex-col text-xs font-bold">
            Copies
            <input
              value={form.copies}
              onChange={(e) => rhf.setValue('copies', e.target.value)}
              className={`${input} w-16 font-normal`}
              inputMode="numeric"
            />
          </label>
          <label className="flex flex-col text-xs font-bold">
            Wasted
            <input
              value={form.wasted}
              placeholder={form.result === 'good' ? '0' : 'all'}
              onChange={(e) => rhf.setValue('wasted', e.target.value)}
              className={`${input} w-14 font-normal`}
              inputMode="numeric"
            />
          </label>
          {pick('stockId', 'Stock', stock.data ?? [], 'Choose…')}
          {pick('printerId', 'Printer', printers)}
          {pick('cutterId', 'Cutter', cutters)}
          <label className="flex flex-col text-xs font-bold">
            Result
            <select value={form.result} onChange={(e) => rhf.setValue('result', e.target.value)} className={`${input} font-normal`}>
              {RUN_RESULTS.map((r) => (
                <option key={r} value={r}>
                  {RUN_RESULT_LABELS[r]}
                </option>
              ))}
            </select>
          </label>
          <label className="flex flex-col text-xs font-bold">
            Notes
            <input value={form.notes} onChange={(e) => rhf.setValue('notes', e.target.value)} className={`${input} w-48 font-normal`} />
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
              onChange={(e) => rhf.setValue('printedOn', e.target.value)}
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
      <RunsTable runs={runs.data ?? []} />
      {runs.data?.length === 0 && <p className="mt-2 text-ink-faint">No runs match.</p>}
    </section>
  );
}
