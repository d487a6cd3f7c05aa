import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { LicenceInput, LicenceKind, LicenceView } from '@shared/schemas/library';
import { LICENCE_KINDS, LICENCE_LABELS, licenceSchema } from '@shared/schemas/library';

/** Licence kind, source, notes and unit limit; validated with the shared schema before saving. */
export function LicenceForm({
  licence,
  onSave,
  hint,
  onProof,
}: {
  licence: (Pick<LicenceView, 'kind' | 'source' | 'notes' | 'unitLimit'> & Partial<Pick<LicenceView, 'proofName' | 'proofUrl'>>) | null;
  onSave: (licence: LicenceInput | null) => Promise<unknown>;
  hint?: string;
  onProof?: (file: File) => Promise<unknown>;
}) {
  // A fieldset inside the forms that use it (no form of its own): react-hook-form holds the values,
  // checked with the shared licence schema when saved.
  const form = useForm({
    defaultValues: {
      kind: (licence?.kind ?? '') as LicenceKind | '',
      source: licence?.source ?? '',
      notes: licence?.notes ?? '',
      unitLimit: licence?.unitLimit ? String(licence.unitLimit) : '',
    },
  });
  const kind = form.watch('kind');
  const errors = form.formState.errors;
  const [saved, setSaved] = useState(false);

  const save = async () => {
    setSaved(false);
    const { source, notes, unitLimit } = form.getValues();
    if (!kind) {
      await onSave(null);
      setSaved(true);
      return;
    }
    const parsed = licenceSchema.safeParse({ kind, source, notes, unitLimit: unitLimit === '' ? null : unitLimit });
    if (!parsed.success) {
      for (const issue of parsed.error.issues) form.setError(String(issue.path[0]) as 'unitLimit', { message: issue.message });
      return;
    }
    form.clearErrors();
    await onSave(parsed.data);
    setSaved(true);
  };

  return (
    <fieldset className="flex flex-col gap-2 text-sm">
      <legend className="font-extrabold">Licence</legend>
      {hint && <p className="text-xs text-ink-faint">{hint}</p>}
      <select
        aria-label="Licence kind"
        {...form.register('kind')}
        className="w-full min-w-0 rounded border-2 border-paper-edge bg-white px-2 py-1"
      >
        <option value="">No licence recorded</option>
        {LICENCE_KINDS.map((k) => (
          <option key={k} value={k}>
            {LICENCE_LABELS[k]}
          </option>
        ))}
      </select>
      {kind && (
        <>
          <input
            aria-label="Where the art came from"
            placeholder="Source (shop, designer, link)"
            {...form.register('source')}
            className="w-full min-w-0 rounded border-2 border-paper-edge px-2 py-1"
          />
          {kind === 'commercial_limited' && (
            <>
              <input
                aria-label="Units allowed"
                inputMode="numeric"
                placeholder="Units allowed"
                {...form.register('unitLimit')}
                aria-invalid={errors.unitLimit ? true : undefined}
                className="w-full min-w-0 rounded border-2 border-paper-edge px-2 py-1"
              />
              {errors.unitLimit && (
                <p role="alert" className="font-semibold text-alarm">
                  {errors.unitLimit.message}
                </p>
              )}
            </>
          )}
          <textarea
            aria-label="Licence notes"
            placeholder="Notes"
            {...form.register('notes')}
            rows={2}
            className="w-full min-w-0 rounded border-2 border-paper-edge px-2 py-1"
          />
        </>
      )}
      {licence?.kind && onProof && (
        <label className="flex flex-col gap-1">
          <span className="font-bold">Proof (receipt, licence text)</span>
          {licence.proofUrl && (
            <a href={licence.proofUrl} className="text-peel-deep underline">
              {licence.proofName}
            </a>
          )}
          <input type="file" aria-label="Attach a licence proof" onChange={(e) => e.target.files?.[0] && void onProof(e.target.files[0])} />
        </label>
      )}
      <button
        type="button"
        onClick={() => void save()}
        className="self-start rounded-full border-2 border-paper-edge px-3 py-1 font-bold hover:border-ink"
      >
        Save licence
      </button>
      {saved && (
        <p role="status" className="text-sage-deep">
          Licence saved.
        </p>
      )}
    </fieldset>
  );
}
