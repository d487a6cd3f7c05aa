import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { ProfileView } from '@shared/schemas/sheets';
import { PAPER_SIZES, REG_MARK_LABELS, REG_MARK_SHAPES } from '@shared/schemas/sheets';
import type { LengthUnit } from '@shared/units';
import { fromMm, toMm } from '@shared/units';
import { FormMessage } from '@/components/form';
import { ApiError } from '@/lib/api-client';
import type { ProfileForm as ProfileBody } from '../api/sheets';

/** Lengths as typed in the user's unit; a new profile starts from common practice (6.75 × 9.25 in on Letter, 1/8 in gaps). */
function draftFrom(unit: LengthUnit, p?: ProfileView) {
  const len = (mm: number) => String(+fromMm(mm, unit).toFixed(unit === 'in' ? 3 : 2));
  return {
    name: p?.name ?? '',
    paper: p?.paper ?? 'letter',
    paperWidth: p?.paper === 'custom' ? len(p.paperWidthMm) : '',
    paperHeight: p?.paper === 'custom' ? len(p.paperHeightMm) : '',
    areaWidth: len(p?.areaWidthMm ?? 171.45),
    areaHeight: len(p?.areaHeightMm ?? 234.95),
    margin: len(p?.safeMarginMm ?? (unit === 'in' ? 3.175 : 3)),
    gap: len(p?.minGapMm ?? (unit === 'in' ? 3.175 : 3)),
    smallest: len(p?.smallestStickerMm ?? 12.7),
    feature: len(p?.minFeatureMm ?? 1),
    bridge: len(p?.bridgeWidthMm ?? 3),
    spot: p?.spotColour ?? 'CutContour',
    marks: p?.regMarkShape ?? 'none',
    markSize: len(p?.regMarkSizeMm ?? 5),
    markOffset: len(p?.regMarkOffsetMm ?? 5),
  };
}

/** Adds a sheet profile (no `profile`) or edits one; sheets already made keep their print area. */
export function ProfileForm({
  profile,
  unit,
  onSave,
  onCancel,
}: {
  profile?: ProfileView;
  unit: LengthUnit;
  onSave: (body: ProfileBody) => Promise<unknown>;
  onCancel?: () => void;
}) {
  // The fields as typed live in react-hook-form; lengths are read in the user's unit and the server names a refused one.
  const rhf = useForm({ defaultValues: draftFrom(unit, profile) });
  const form = rhf.watch();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ text: string; tone: 'ok' | 'error' } | null>(null);
  const field = (key: keyof typeof form, label: string) => (
    <label className="flex flex-col gap-1 text-xs font-bold">
      {label}
      <input {...rhf.register(key)} className="w-24 rounded border-2 border-paper-edge px-2 py-1 font-normal" inputMode="decimal" />
    </label>
  );
  const submit = async () => {
    setErrors({});
    setMessage(null);
    const mm = (v: string) => toMm(Number(v), unit);
    // An unchanged paper and print area keeps its place (a profile may have been placed off-centre through the API).
    const start = profile && draftFrom(unit, profile);
    const samePlace =
      start && (['paper', 'paperWidth', 'paperHeight', 'areaWidth', 'areaHeight'] as const).every((k) => form[k] === start[k]);
    try {
      await onSave({
        ...(samePlace && { areaXMm: profile.areaXMm, areaYMm: profile.areaYMm }),
        name: form.name,
        paper: form.paper,
        ...(form.paper === 'custom' ? { paperWidthMm: mm(form.paperWidth), paperHeightMm: mm(form.paperHeight) } : {}),
        areaWidthMm: mm(form.areaWidth),
        areaHeightMm: mm(form.areaHeight),
        safeMarginMm: mm(form.margin),
        minGapMm: mm(form.gap),
        smallestStickerMm: mm(form.smallest),
        minFeatureMm: mm(form.feature),
        bridgeWidthMm: mm(form.bridge),
        spotColour: form.spot,
        regMarkShape: form.marks,
        regMarkSizeMm: mm(form.markSize),
        regMarkOffsetMm: mm(form.markOffset),
      });
      setMessage({ text: profile ? 'Profile saved.' : 'Profile added.', tone: 'ok' });
    } catch (e) {
      if (!(e instanceof ApiError)) throw e;
      setErrors(e.fields);
      setMessage({ text: e.message, tone: 'error' });
    }
  };
  return (
    <form aria-label={profile ? `Edit ${profile.name}` : 'Add a profile'} onSubmit={rhf.handleSubmit(() => void submit())}>
      <div className="mt-2 flex flex-wrap items-end gap-2">
        <label className="flex flex-col gap-1 text-xs font-bold">
          Name
          <input {...rhf.register('name')} className="rounded border-2 border-paper-edge px-2 py-1 font-normal" />
        </label>
        <label className="flex flex-col gap-1 text-xs font-bold">
          Paper
          <select {...rhf.register('paper')} className="rounded border-2 border-paper-edge bg-white px-2 py-1 font-normal">
            <option value="letter">{PAPER_SIZES.letter.label}</option>
            <option value="a4">{PAPER_SIZES.a4.label}</option>
            <option value="custom">Custom</option>
          </select>
        </label>
        {form.paper === 'custom' && field('paperWidth', `Paper width (${unit})`)}
        {form.paper === 'custom' && field('paperHeight', `Paper height (${unit})`)}
        {field('areaWidth', `Print area width (${unit})`)}
        {field('areaHeight', `Print area height (${unit})`)}
        {field('margin', `Safe margin (${unit})`)}
        {field('gap', `Minimum gap (${unit})`)}
        {field('smallest', `Smallest sticker (${unit})`)}
        {field('feature', `Smallest cuttable feature (${unit})`)}
        {field('bridge', `Bridge width (${unit})`)}
        <label className="flex flex-col gap-1 text-xs font-bold">
          Cut layer colour name
          <input {...rhf.register('spot')} className="w-28 rounded border-2 border-paper-edge px-2 py-1 font-normal" />
        </label>
        <label className="flex flex-col gap-1 text-xs font-bold">
          Registration marks
          <select {...rhf.register('marks')} className="rounded border-2 border-paper-edge bg-white px-2 py-1 font-normal">
            {REG_MARK_SHAPES.map((s) => (
              <option key={s} value={s}>
                {REG_MARK_LABELS[s]}
              </option>
            ))}
          </select>
        </label>
        {form.marks !== 'none' && field('markSize', `Mark size (${unit})`)}
        {form.marks !== 'none' && field('markOffset', `Mark offset (${unit})`)}
        <button type="submit" className="rounded-full bg-ink px-4 py-1 font-bold text-paper">
          {profile ? 'Save profile' : 'Add profile'}
        </button>
        {onCancel && (
          <button type="button" className="font-bold underline" onClick={onCancel}>
            Cancel
          </button>
        )}
      </div>
      <p className="mt-1 text-xs text-ink-faint">
        The print area is centred on the paper. Common practice for home cutters: 6.75 × 9.25 in on Letter, gaps of at least 1/8 in. Parts
        of the art the border joins get bridges at least the bridge width (common practice: 3 mm). Registration marks are for cutters that
        read marks printed with the art; most cutters' own software adds its own, so leave them off unless your machine's manual asks for
        printed marks.{profile ? ' Sheets already made keep their print area; preflight uses the new smallest sizes.' : ''}
      </p>
      {Object.values(errors).map((e) => (
        <p key={e} role="alert" className="font-semibold text-alarm">
          {e}
        </p>
      ))}
      {message && !Object.keys(errors).length && <FormMessage tone={message.tone}>{message.text}</FormMessage>}
    </form>
  );
}
