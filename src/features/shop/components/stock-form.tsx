import { useForm } from 'react-hook-form';
import { FINISH_LABELS, STOCK_FINISHES } from '@shared/schemas/shop';
import type { StockView } from '@shared/schemas/shop';
import type { LengthUnit } from '@shared/units';
import { fromMm, parseLength } from '@shared/units';
import { useAction } from '@/hooks/use-action';

const input = 'rounded border-2 border-paper-edge px-2 py-1 font-normal';

/** The form's fields as typed: strings, so a half-typed number is kept until the server says what is wrong. */
const draftFrom = (unit: LengthUnit, s?: StockView) => ({
  name: s?.name ?? '',
  finish: s?.finish ?? 'glossy',
  paper: s?.paper ?? 'letter',
  paperWidth: s?.paper === 'custom' ? String(+fromMm(s.paperWidthMm, unit).toFixed(3)) : '',
  paperHeight: s?.paper === 'custom' ? String(+fromMm(s.paperHeightMm, unit).toFixed(3)) : '',
  packPrice: s ? String(s.packPrice) : '',
  sheetsPerPack: s ? String(s.sheetsPerPack) : '',
  onHand: s ? String(s.onHand) : '0',
  lowAt: s?.lowAt === null || s?.lowAt === undefined ? '' : String(s.lowAt),
  paperSetting: s?.printerSettings.paperSetting ?? '',
  quality: s?.printerSettings.quality ?? '',
  colour: s?.printerSettings.colour ?? '',
  printerOther: s?.printerSettings.other ?? '',
  material: s?.cutterSettings.material ?? '',
  pressure: s?.cutterSettings.pressure ?? '',
  passes: s ? String(s.cutterSettings.passes) : '1',
  blade: s?.cutterSettings.blade ?? '',
  rating: s?.rating ? String(s.rating) : '',
  foodSafe: s?.foodSafe ?? false,
  skinSafe: s?.skinSafe ?? false,
  notes: s?.notes ?? '',
});
type Draft = ReturnType<typeof draftFrom>;

/** The request body for POST/PUT /stock (the server validates it; the count on hand only counts on create). */
const bodyOf = (d: Draft, unit: LengthUnit) => ({
  name: d.name,
  finish: d.finish,
  paper: d.paper,
  ...(d.paper === 'custom' && {
    paperWidthMm: parseLength(d.paperWidth, unit) ?? undefined,
    paperHeightMm: parseLength(d.paperHeight, unit) ?? undefined,
  }),
  packPrice: d.packPrice,
  sheetsPerPack: d.sheetsPerPack,
  onHand: d.onHand,
  lowAt: d.lowAt,
  printerSettings: { paperSetting: d.paperSetting, quality: d.quality, colour: d.colour, other: d.printerOther },
  cutterSettings: { material: d.material, pressure: d.pressure, passes: d.passes, blade: d.blade },
  rating: d.rating === '' ? null : d.rating,
  foodSafe: d.foodSafe,
  skinSafe: d.skinSafe,
  notes: d.notes,
});

/** The server's field paths that are not the form's own key's name. */
const FIELD_OF: Record<string, keyof Draft> = {
  paperWidthMm: 'paperWidth',
  paperHeightMm: 'paperHeight',
  'printerSettings.other': 'printerOther',
};

/** Adds stock (no `stock`) or edits it; every field the shelf keeps, grouped as the maker thinks of them. */
export function StockForm({
  stock,
  currency,
  unit,
  onSave,
  onCancel,
}: {
  stock?: StockView;
  currency: string;
  unit: LengthUnit;
  onSave: (body: ReturnType<typeof bodyOf>) => Promise<unknown>;
  onCancel?: () => void;
}) {
  // The fields as typed live in react-hook-form; the server validates the body (shared schema) and names each refused field.
  const form = useForm({ defaultValues: draftFrom(unit, stock) });
  const d = form.watch();
  const { error, fields, busy, run } = useAction();
  // Every refused field at once, each beside its input (the server's paths named as the form's keys).
  const fieldErrors: Partial<Record<keyof Draft, string>> = {};
  for (const [path, message] of Object.entries(fields)) {
    const key = (FIELD_OF[path] ?? path.split('.').pop()) as keyof Draft;
    fieldErrors[key] ??= message;
  }
  const formKey = stock ? `stock-${stock.id}` : 'stock-new';
  const text = (key: keyof Draft, label: string, w = 'w-28') => (
    <div className="flex flex-col gap-1 text-xs font-bold">
      <label className="flex flex-col gap-1">
        {label}
        <input
          {...form.register(key)}
          aria-invalid={fieldErrors[key] ? true : undefined}
          aria-describedby={fieldErrors[key] ? `${formKey}-${key}-error` : undefined}
          className={`${input} ${w} ${fieldErrors[key] ? 'border-alarm' : ''}`}
        />
      </label>
      {fieldErrors[key] && (
        <span id={`${formKey}-${key}-error`} data-testid={`error-${key}`} className={`${w} min-w-28 font-semibold text-alarm`}>
          {fieldErrors[key]}
        </span>
      )}
    </div>
  );
  const tick = (key: 'foodSafe' | 'skinSafe', label: string) => (
    <label className="flex items-center gap-1 text-xs font-bold">
      <input type="checkbox" {...form.register(key)} />
      {label}
    </label>
  );
  const submit = () =>
    run(async () => {
      await onSave(bodyOf(d, unit));
      if (!stock) form.reset({ ...draftFrom(unit), finish: d.finish, paper: d.paper });
    });
  return (
    <form
      aria-label={stock ? `Edit ${stock.name}` : 'Add stock'}
      className="flex flex-col gap-2 rounded-lg bg-paper p-3"
      onSubmit={form.handleSubmit(() => void submit())}
    >
      <div className="flex flex-wrap items-end gap-2">
        {text('name', 'Name', 'w-44')}
        <label className="flex flex-col gap-1 text-xs font-bold">
          Finish
          <select {...form.register('finish')} className={input}>
            {STOCK_FINISHES.map((f) => (
              <option key={f} value={f}>
                {FINISH_LABELS[f]}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-xs font-bold">
          Paper
          <select {...form.register('paper')} className={input}>
            <option value="letter">Letter</option>
            <option value="a4">A4</option>
            <option value="custom">Other size</option>
          </select>
        </label>
        {d.paper === 'custom' && text('paperWidth', `Width (${unit})`, 'w-20')}
        {d.paper === 'custom' && text('paperHeight', `Height (${unit})`, 'w-20')}
        {text('packPrice', `Pack price (${currency})`, 'w-20')}
        {text('sheetsPerPack', 'Sheets per pack', 'w-20')}
        {!stock && text('onHand', 'On hand', 'w-16')}
        {text('lowAt', 'Running low at (sheets)', 'w-20')}
        {text('rating', 'Rating 1–5', 'w-12')}
      </div>
      <fieldset className="flex flex-wrap items-end gap-2">
        <legend className="mb-1 text-xs font-extrabold text-ink-soft">Printer settings that worked</legend>
        {text('paperSetting', 'Paper setting')}
        {text('quality', 'Quality')}
        {text('colour', 'Colour')}
        {text('printerOther', 'Other', 'w-44')}
      </fieldset>
      <fieldset className="flex flex-wrap items-end gap-2">
        <legend className="mb-1 text-xs font-extrabold text-ink-soft">Cutter settings that worked (as your machine names them)</legend>
        {text('material', 'Material setting')}
        {text('pressure', 'Pressure', 'w-16')}
        {text('passes', 'Passes', 'w-12')}
        {text('blade', 'Blade')}
      </fieldset>
      <div className="flex flex-wrap items-end gap-3">
        {tick('foodSafe', 'Maker rates it food-safe')}
        {tick('skinSafe', 'Maker rates it skin-safe')}
        <label className="flex grow flex-col gap-1 text-xs font-bold">
          Notes
          <input {...form.register('notes')} className={`${input} w-full`} />
        </label>
      </div>
      <div className="flex items-center gap-3">
        <button type="submit" disabled={busy} className="rounded-full bg-ink px-4 py-1 font-bold text-paper disabled:opacity-60">
          {busy ? 'Saving…' : stock ? 'Save stock' : 'Add stock'}
        </button>
        {onCancel && (
          <button type="button" className="font-bold underline" onClick={onCancel}>
            Cancel
          </button>
        )}
        {error && (
          <p role="alert" className="font-semibold text-alarm">
            {Object.keys(fields).length > 1
              ? `${Object.keys(fields).length} fields need a change: see the notes beside them.`
              : (Object.values(fields)[0] ?? error)}
          </p>
        )}
      </div>
    </form>
  );
}
