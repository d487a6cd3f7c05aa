import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { FINISH_LABELS, STOCK_FINISHES } from '../../../../shared/schemas/shop';
import type { StockView } from '../../../../shared/schemas/shop';
import { formatMoney } from '../../../../shared/production/cost';
import { shopApi, shopKeys, useStock } from '../../../api/shop';
import { useAction } from '../../../hooks/use-action';

const input = 'rounded border-2 border-paper-edge px-2 py-1';

/** The team's stock: cost per sheet, sheets on hand, and the printer and cutter settings that worked. */
export function StockShelf({ teamId, currency, canManage, canRecord }: { teamId: string; currency: string; canManage: boolean; canRecord: boolean }) {
  const client = useQueryClient();
  const stock = useStock(teamId);
  const { error, run } = useAction();
  const [form, setForm] = useState({ name: '', finish: 'glossy', paper: 'letter', packPrice: '', sheetsPerPack: '', onHand: '0', material: '', pressure: '', passes: '1', paperSetting: '', quality: '', rating: '' });
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
  const add = () =>
    run(async () => {
      await shopApi.createStock(teamId, {
        name: form.name, finish: form.finish, paper: form.paper, packPrice: form.packPrice, sheetsPerPack: form.sheetsPerPack, onHand: form.onHand,
        printerSettings: { paperSetting: form.paperSetting, quality: form.quality, colour: '', other: '' },
        cutterSettings: { material: form.material, pressure: form.pressure, passes: form.passes, blade: '' },
        rating: form.rating === '' ? null : form.rating,
      });
      setForm({ ...form, name: '', packPrice: '', sheetsPerPack: '' });
      await refresh();
    });
  const field = (key: keyof typeof form, label: string, w = 'w-28') => (
    <label className="flex flex-col gap-1 text-xs font-bold">{label}<input value={form[key]} onChange={(e) => setForm({ ...form, [key]: e.target.value })} className={`${input} ${w} font-normal`} /></label>
  );
  return (
    <section aria-labelledby="stock-title" className="rounded-sticker border-2 border-paper-edge bg-white p-4 text-sm">
      <h2 id="stock-title" className="mb-1 text-lg font-extrabold">Stock shelf</h2>
      <p className="mb-2 text-xs text-ink-soft">Inkjet sticker paper is not food-safe or skin-safe unless its maker says so: check the pack before using it on food, cups or skin.</p>
      <table className="w-full [&_td]:pr-2" data-testid="stock-table">
        <thead className="text-left text-xs text-ink-soft"><tr><th>Name</th><th>Finish</th><th>Per sheet</th><th>On hand</th><th>Cutter settings</th><th>Rating</th><th><span className="sr-only">Count</span></th></tr></thead>
        <tbody>
          {stock.data?.map((s) => (
            <tr key={s.id} className="border-t border-paper-deep" data-testid={`stock-${s.id}`}>
              <td className="py-1 font-bold">{s.name}{(s.foodSafe || s.skinSafe) && <span className="ml-1 rounded-full bg-sage-light px-2 text-xs text-sage-deep">{[s.foodSafe && 'food-safe', s.skinSafe && 'skin-safe'].filter(Boolean).join(', ')}</span>}</td>
              <td>{FINISH_LABELS[s.finish]}</td>
              <td>{formatMoney(s.costPerSheet, currency)} <span className="text-xs text-ink-faint">({formatMoney(s.packPrice, currency)} / {s.sheetsPerPack})</span></td>
              <td data-testid="on-hand" className={s.onHand < 0 ? 'font-bold text-alarm' : s.onHand < 10 ? 'font-bold text-peel-deep' : ''}>{s.onHand}</td>
              <td className="text-xs">{[s.cutterSettings.material, s.cutterSettings.pressure && `pressure ${s.cutterSettings.pressure}`, `${s.cutterSettings.passes} pass${s.cutterSettings.passes === 1 ? '' : 'es'}`].filter(Boolean).join(' · ')}</td>
              <td>{s.rating ? '★'.repeat(s.rating) : '—'}</td>
              <td className="whitespace-nowrap text-right">
                {canRecord && (
                  <>
                    <button type="button" className="mr-1 rounded border-2 border-paper-edge px-2 font-bold" onClick={() => { const n = Number(window.prompt('Sheets added (a delivery):', '25')); if (n > 0) void adjust(s, n); }}>Add sheets</button>
                    <button type="button" className="rounded border-2 border-paper-edge px-2 font-bold" onClick={() => { const n = Number(window.prompt('Sheets to take off (spoiled, counted short):', '1')); if (n > 0) void adjust(s, -n); }}>Take off</button>
                  </>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {canManage && (
        <div className="mt-3 flex flex-wrap items-end gap-2 border-t border-paper-deep pt-3">
          {field('name', 'Name', 'w-44')}
          <label className="flex flex-col gap-1 text-xs font-bold">Finish<select value={form.finish} onChange={(e) => setForm({ ...form, finish: e.target.value })} className={input}>{STOCK_FINISHES.map((f) => <option key={f} value={f}>{FINISH_LABELS[f]}</option>)}</select></label>
          <label className="flex flex-col gap-1 text-xs font-bold">Paper<select value={form.paper} onChange={(e) => setForm({ ...form, paper: e.target.value })} className={input}><option value="letter">Letter</option><option value="a4">A4</option></select></label>
          {field('packPrice', `Pack price (${currency})`, 'w-20')}
          {field('sheetsPerPack', 'Sheets per pack', 'w-20')}
          {field('onHand', 'On hand', 'w-16')}
          {field('paperSetting', 'Printer paper setting')}
          {field('quality', 'Print quality')}
          {field('material', 'Cutter material setting')}
          {field('pressure', 'Pressure', 'w-16')}
          {field('passes', 'Passes', 'w-12')}
          {field('rating', 'Rating 1–5', 'w-12')}
          <button type="button" onClick={() => void add()} className="rounded-full bg-ink px-4 py-1 font-bold text-paper">Add stock</button>
        </div>
      )}
      {error && <p role="alert" className="mt-2 font-semibold text-alarm">{error}</p>}
    </section>
  );
}
