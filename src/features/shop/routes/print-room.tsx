import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { settingsQueryOptions, shopApi, useMachines, useStock } from '@/api/shop';
import { PageTitle } from '@/components/page-title';
import { ORDER_CURRENCIES } from '@shared/orders/money';
import { useAction } from '@/hooks/use-action';
import { useMe } from '@/features/auth/api/me';
import { useTeamRole } from '@/features/auth/use-team-role';
import { MachinesBench } from '../components/machines-bench';
import { RunLog } from '../components/run-log';
import { ShopReminders } from '../components/shop-reminders';
import { StockShelf } from '../components/stock-shelf';

function ShopRates({ teamId, canManage }: { teamId: string; canManage: boolean }) {
  const client = useQueryClient();
  const settings = useQuery(settingsQueryOptions(teamId));
  // The rates as typed live in react-hook-form, filled in once the saved ones arrive; the server reads the numbers and names any that are not.
  const rhf = useForm({
    defaultValues: {
      currency: '$',
      labourRatePerHour: '0',
      markupPercent: '100',
      wastePercent: '0',
      defaultStockId: '',
      defaultPrinterId: '',
      defaultCutterId: '',
      currencyCode: 'USD',
      viewersSeePrices: true,
    },
  });
  const form = rhf.watch();
  const setForm = (values: Partial<typeof form>) => {
    for (const [key, value] of Object.entries(values)) rhf.setValue(key as keyof typeof form, value as never, { shouldDirty: true });
  };
  const stock = useStock(teamId);
  const machines = useMachines(teamId);
  const { error, run } = useAction({ preferField: true });
  const [saved, setSaved] = useState(false);
  useEffect(() => {
    if (settings.data)
      rhf.reset(
        {
          currency: settings.data.currency,
          labourRatePerHour: String(settings.data.labourRatePerHour),
          markupPercent: String(settings.data.markupPercent),
          wastePercent: String(settings.data.wastePercent),
          defaultStockId: settings.data.defaultStockId ?? '',
          defaultPrinterId: settings.data.defaultPrinterId ?? '',
          defaultCutterId: settings.data.defaultCutterId ?? '',
          currencyCode: settings.data.currencyCode ?? 'USD',
          viewersSeePrices: settings.data.viewersSeePrices ?? true,
        },
        // The saved rates arrive (or arrive again on a refetch) without taking what the maker is typing.
        { keepDirtyValues: true },
      );
  }, [settings.data, rhf]);
  const field = (key: 'currency' | 'labourRatePerHour' | 'markupPercent' | 'wastePercent', label: string) => (
    <label className="flex flex-col text-xs font-bold">
      {label}
      <input
        value={form[key]}
        disabled={!canManage}
        onChange={(e) => {
          setSaved(false);
          setForm({ [key]: e.target.value });
        }}
        className="w-24 rounded border-2 border-paper-edge px-2 py-1 font-normal"
      />
    </label>
  );
  const usual = (
    key: 'defaultStockId' | 'defaultPrinterId' | 'defaultCutterId',
    label: string,
    options: Array<{ id: string; name: string }>,
  ) => (
    <label className="flex flex-col text-xs font-bold">
      {label}
      <select
        value={form[key]}
        disabled={!canManage}
        onChange={(e) => {
          setSaved(false);
          setForm({ [key]: e.target.value });
        }}
        className="w-40 rounded border-2 border-paper-edge px-2 py-1 font-normal"
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
  return (
    <section aria-labelledby="rates-title" className="rounded-sticker border-2 border-paper-edge bg-white p-4 text-sm">
      <h2 id="rates-title" className="mb-2 text-lg font-extrabold">
        Shop rates
      </h2>
      <div className="flex flex-wrap items-end gap-2">
        {field('currency', 'Currency sign')}
        <label className="flex flex-col text-xs font-bold">
          Buyers pay in
          <select
            value={form.currencyCode}
            disabled={!canManage}
            onChange={(e) => {
              setSaved(false);
              setForm({ currencyCode: e.target.value });
            }}
            className="w-24 rounded border-2 border-paper-edge px-2 py-1 font-normal"
          >
            {ORDER_CURRENCIES.map((c) => (
              <option key={c}>{c}</option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-1 text-xs font-bold">
          <input
            type="checkbox"
            checked={form.viewersSeePrices}
            disabled={!canManage}
            onChange={(e) => {
              setSaved(false);
              setForm({ viewersSeePrices: e.target.checked });
            }}
          />
          Viewers see order prices
        </label>
        {field('labourRatePerHour', 'Labour per hour')}
        {field('markupPercent', 'Markup (%)')}
        {field('wastePercent', 'Waste allowance (%)')}
        {usual('defaultStockId', 'Usual stock', stock.data ?? [])}
        {usual(
          'defaultPrinterId',
          'Usual printer',
          (machines.data ?? []).filter((m) => m.kind === 'printer'),
        )}
        {usual(
          'defaultCutterId',
          'Usual cutter',
          (machines.data ?? []).filter((m) => m.kind === 'cutter'),
        )}
        {canManage && (
          <button
            type="button"
            className="rounded-full bg-ink px-4 py-1 font-bold text-paper"
            onClick={() =>
              void run(async () => {
                client.setQueryData(settingsQueryOptions(teamId).queryKey, await shopApi.saveSettings(teamId, form));
                setSaved(true);
              })
            }
          >
            Save rates
          </button>
        )}
        {saved && (
          <span role="status" className="text-sage-deep">
            Saved.
          </span>
        )}
      </div>
      <p className="mt-1 text-xs text-ink-faint">
        A sheet's cost is its stock, ink from the print's coverage, its share of blade wear, the waste allowance on those (misprints and
        spoiled sheets) and labour; the price adds the markup. Each sheet shows its figures in the editor; a sheet with no choice of its own
        is costed on what its last run used, else on the usual stock, printer and cutter.
      </p>
      {error && (
        <p role="alert" className="text-alarm">
          {error}
        </p>
      )}
    </section>
  );
}

/** The print room: stock, machines and blades, the run log and the shop's rates. */
export function PrintRoomRoute() {
  const { teamId, can } = useTeamRole();
  const { data: me } = useMe();
  const settings = useQuery({ ...settingsQueryOptions(teamId ?? ''), enabled: !!teamId });
  if (!teamId) return null;
  const currency = settings.data?.currency ?? '$';
  const rights = { teamId, currency, canManage: can('shop.manage'), canRecord: can('shop.record') };
  return (
    <div className="flex flex-col gap-4">
      <PageTitle title="Print room">
        <p className="text-sm text-ink-soft">What you print on, what you cut with, and how each run came out.</p>
      </PageTitle>
      <ShopReminders teamId={teamId} />
      <RunLog teamId={teamId} canRecord={rights.canRecord} />
      <StockShelf {...rights} unit={me?.user.unit ?? 'in'} />
      <div className="grid items-start gap-4 xl:grid-cols-[3fr_2fr]">
        <MachinesBench {...rights} />
        <ShopRates teamId={teamId} canManage={rights.canManage} />
      </div>
    </div>
  );
}
