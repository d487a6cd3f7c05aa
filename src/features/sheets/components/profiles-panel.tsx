import { useState } from 'react';
import type { ProfileView } from '../../../../shared/schemas/sheets';
import { PAPER_SIZES } from '../../../../shared/schemas/sheets';
import type { LengthUnit } from '../../../../shared/units';
import { formatLength, toMm } from '../../../../shared/units';
import { FormMessage } from '../../../components/form';
import { ApiError } from '../../../lib/api-client';
import { useCreateProfile, useMakeDefaultProfile } from '../api/sheets';

/** Sheet profiles, shown to everyone; owners and admins add them and pick the default. */
export function ProfilesPanel({ teamId, profiles, unit, canManage }: { teamId: string; profiles: ProfileView[]; unit: LengthUnit; canManage: boolean }) {
  const create = useCreateProfile(teamId);
  const makeDefault = useMakeDefaultProfile(teamId);
  const [form, setForm] = useState({ name: '', paper: 'letter', paperWidth: '', paperHeight: '', areaWidth: unit === 'in' ? '6.75' : '171.45', areaHeight: unit === 'in' ? '9.25' : '234.95', margin: unit === 'in' ? '0.125' : '3', gap: unit === 'in' ? '0.125' : '3', smallest: unit === 'in' ? '0.5' : '12.7', feature: unit === 'in' ? '0.04' : '1' });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const f = (n: number) => formatLength(n, unit, unit === 'in' ? 3 : 1);
  const field = (key: keyof typeof form, label: string) => (
    <label className="flex flex-col gap-1 text-xs font-bold">
      {label}
      <input value={form[key]} onChange={(e) => setForm({ ...form, [key]: e.target.value })} className="w-24 rounded border-2 border-paper-edge px-2 py-1 font-normal" inputMode="decimal" />
    </label>
  );
  const submit = async () => {
    setErrors({});
    setMessage(null);
    const mm = (v: string) => toMm(Number(v), unit);
    try {
      await create.mutateAsync({
        name: form.name,
        paper: form.paper as 'letter' | 'a4' | 'custom',
        ...(form.paper === 'custom' ? { paperWidthMm: mm(form.paperWidth), paperHeightMm: mm(form.paperHeight) } : {}),
        areaWidthMm: mm(form.areaWidth),
        areaHeightMm: mm(form.areaHeight),
        safeMarginMm: mm(form.margin),
        minGapMm: mm(form.gap),
        smallestStickerMm: mm(form.smallest),
        minFeatureMm: mm(form.feature),
      });
      setMessage('Profile added.');
    } catch (e) {
      if (e instanceof ApiError) {
        setErrors(e.fields);
        setMessage(e.message);
      }
    }
  };
  return (
    <section aria-labelledby="profiles-title" className="rounded-sticker border-2 border-paper-edge bg-white p-5 text-sm">
      <h2 id="profiles-title" className="mb-2 text-lg font-extrabold">Sheet profiles</h2>
      <ul className="mb-3 flex flex-col gap-2">
        {profiles.map((p) => (
          <li key={p.id} className="rounded-lg bg-paper px-3 py-2">
            <strong>{p.name}</strong> {p.isDefault && <span className="rounded-full bg-sage-light px-2 text-xs text-sage-deep">default</span>}
            <div className="text-ink-soft">
              Print area {f(p.areaWidthMm)} × {f(p.areaHeightMm)} on {p.paper === 'custom' ? `${f(p.paperWidthMm)} × ${f(p.paperHeightMm)}` : PAPER_SIZES[p.paper].label} · margin {f(p.safeMarginMm)} · gap {f(p.minGapMm)} · smallest sticker {f(p.smallestStickerMm)} · smallest feature {f(p.minFeatureMm)}
            </div>
            {canManage && !p.isDefault && (
              <button type="button" className="text-xs font-bold underline" onClick={() => makeDefault.mutate(p.id)}>Make default</button>
            )}
          </li>
        ))}
      </ul>
      {canManage && (
        <details>
          <summary className="cursor-pointer font-bold">Add a profile</summary>
          <div className="mt-2 flex flex-wrap items-end gap-2">
            <label className="flex flex-col gap-1 text-xs font-bold">Name<input value={form.name} onChange={(e) => setForm({ ...form, name: e.target.value })} className="rounded border-2 border-paper-edge px-2 py-1 font-normal" /></label>
            <label className="flex flex-col gap-1 text-xs font-bold">
              Paper
              <select value={form.paper} onChange={(e) => setForm({ ...form, paper: e.target.value })} className="rounded border-2 border-paper-edge bg-white px-2 py-1 font-normal">
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
            <button type="button" onClick={() => void submit()} className="rounded-full bg-ink px-4 py-1 font-bold text-paper">Add profile</button>
          </div>
          <p className="mt-1 text-xs text-ink-faint">The print area is centred on the paper. Common practice for home cutters: 6.75 × 9.25 in on Letter, gaps of at least 1/8 in.</p>
          {Object.values(errors).map((e) => <p key={e} role="alert" className="font-semibold text-alarm">{e}</p>)}
          {message && !Object.keys(errors).length && <FormMessage tone={create.isError ? 'error' : 'ok'}>{message}</FormMessage>}
        </details>
      )}
    </section>
  );
}
