import { useState } from 'react';
import type { ProfileView } from '@shared/schemas/sheets';
import { PAPER_SIZES, REG_MARK_LABELS } from '@shared/schemas/sheets';
import type { LengthUnit } from '@shared/units';
import { formatFineLength, formatLength } from '@shared/units';
import { useCreateProfile, useMakeDefaultProfile, useUpdateProfile } from '../api/sheets';
import { ProfileForm } from './profile-form';

/** Sheet profiles, shown to everyone; owners and admins add and edit them and pick the default. */
export function ProfilesPanel({
  teamId,
  profiles,
  unit,
  canManage,
}: {
  teamId: string;
  profiles: ProfileView[];
  unit: LengthUnit;
  canManage: boolean;
}) {
  const create = useCreateProfile(teamId);
  const update = useUpdateProfile(teamId);
  const makeDefault = useMakeDefaultProfile(teamId);
  const [editing, setEditing] = useState<string | null>(null);
  const f = (n: number) => formatLength(n, unit, unit === 'in' ? 3 : 1);
  const fine = (n: number) => formatFineLength(n, unit);
  return (
    <section aria-labelledby="profiles-title" className="rounded-sticker border-2 border-paper-edge bg-white p-5 text-sm">
      <h2 id="profiles-title" className="mb-2 text-lg font-extrabold">
        Sheet profiles
      </h2>
      <ul className="mb-3 flex flex-col gap-2">
        {profiles.map((p) => (
          <li key={p.id} className="rounded-lg bg-paper px-3 py-2">
            <strong>{p.name}</strong>{' '}
            {p.isDefault && <span className="rounded-full bg-sage-light px-2 text-xs text-sage-deep">default</span>}
            <div className="text-ink-soft">
              Print area {f(p.areaWidthMm)} × {f(p.areaHeightMm)} on{' '}
              {p.paper === 'custom' ? `${f(p.paperWidthMm)} × ${f(p.paperHeightMm)}` : PAPER_SIZES[p.paper].label} · margin{' '}
              {f(p.safeMarginMm)} · gap {fine(p.minGapMm)} · smallest sticker {f(p.smallestStickerMm)} · smallest feature{' '}
              {fine(p.minFeatureMm)} · bridges {fine(p.bridgeWidthMm)} · cut layer {p.spotColour}
              {p.regMarkShape !== 'none' &&
                ` · marks: ${REG_MARK_LABELS[p.regMarkShape].toLowerCase()} ${f(p.regMarkSizeMm)}, ${f(p.regMarkOffsetMm)} out`}
            </div>
            {canManage && (
              <div className="flex gap-3 text-xs font-bold">
                {!p.isDefault && (
                  <button type="button" className="underline" onClick={() => makeDefault.mutate(p.id)}>
                    Make default
                  </button>
                )}
                <button
                  type="button"
                  className="underline"
                  aria-expanded={editing === p.id}
                  onClick={() => setEditing(editing === p.id ? null : p.id)}
                >
                  Edit<span className="sr-only"> {p.name}</span>
                </button>
              </div>
            )}
            {editing === p.id && (
              <ProfileForm
                key={p.id}
                profile={p}
                unit={unit}
                onCancel={() => setEditing(null)}
                onSave={async (body) => {
                  await update.mutateAsync({ id: p.id, ...body });
                  setEditing(null);
                }}
              />
            )}
          </li>
        ))}
      </ul>
      {canManage && (
        <details>
          <summary className="cursor-pointer font-bold">Add a profile</summary>
          <ProfileForm unit={unit} onSave={(body) => create.mutateAsync(body)} />
        </details>
      )}
    </section>
  );
}
