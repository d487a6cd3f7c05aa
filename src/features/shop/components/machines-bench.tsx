import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { formatMoney } from '@shared/production/cost';
import type { MachineView } from '@shared/schemas/shop';
import { shopApi, shopKeys, useMachines } from '@/api/shop';
import { useAction } from '@/hooks/use-action';
import { MachineForm } from './machine-form';

const input = 'rounded border-2 border-paper-edge px-2 py-1';
const WEAR = { ok: 'bg-sage', near: 'bg-peel', due: 'bg-alarm' } as const;
const today = () => new Date().toISOString().slice(0, 10);

function BladeLine({
  cutter,
  teamId,
  canRecord,
  onChanged,
}: {
  cutter: MachineView;
  teamId: string;
  canRecord: boolean;
  onChanged: () => void;
}) {
  const [fitting, setFitting] = useState(false);
  // The blade as typed lives in react-hook-form; the server validates it and names a bad field.
  const blade = useForm({ defaultValues: { label: '', fittedOn: today(), lifeM: '600', price: '', replaceBy: '' } });
  const { error, run } = useAction({ preferField: true });
  const b = cutter.blade;
  return (
    <div className="mt-1 text-xs" data-testid={`blade-${cutter.id}`}>
      {b ? (
        <>
          <p>
            <strong>{b.label}</strong>, fitted {b.fittedOn}: <span data-testid="blade-length">{b.cutLengthM.toFixed(2)} m</span> cut of{' '}
            {b.lifeM} m{b.replaceBy ? `, or by ${b.replaceBy}` : ''}
          </p>
          <div className="h-2 w-full rounded bg-paper-deep" aria-hidden>
            <div className={`h-2 rounded ${WEAR[b.wear]}`} style={{ width: `${Math.min(100, (100 * b.cutLengthM) / b.lifeM)}%` }} />
          </div>
          {b.wear !== 'ok' && (
            <p role="alert" className="font-bold text-alarm">
              {b.wear === 'due'
                ? `Due for a change (${b.wearReason}): change the blade before the next run.`
                : `Nearly due (${b.wearReason}): have a new blade ready.`}
            </p>
          )}
        </>
      ) : (
        <p className="text-peel-deep">No blade logged yet.</p>
      )}
      {canRecord && !fitting && (
        <button type="button" className="mt-1 font-bold underline" onClick={() => setFitting(true)}>
          Log a blade change…
        </button>
      )}
      {fitting && (
        <div className="mt-1 rounded-lg bg-paper p-2">
          <p className="mb-1 text-ink-soft">
            Switch the cutter off and use the blade tool or guard your machine provides; follow its manual. Blades are sharp.
          </p>
          <div className="flex flex-wrap items-end gap-2">
            <label className="flex flex-col font-bold">
              Blade
              <input {...blade.register('label')} className={`${input} w-36 font-normal`} />
            </label>
            <label className="flex flex-col font-bold">
              Fitted on
              <input type="date" {...blade.register('fittedOn')} className={`${input} font-normal`} />
            </label>
            <label className="flex flex-col font-bold">
              Replace at (m)
              <input {...blade.register('lifeM')} className={`${input} w-20 font-normal`} />
            </label>
            <label className="flex flex-col font-bold">
              or by (date, optional)
              <input type="date" {...blade.register('replaceBy')} className={`${input} font-normal`} />
            </label>
            <label className="flex flex-col font-bold">
              Price
              <input {...blade.register('price')} className={`${input} w-16 font-normal`} />
            </label>
            <button
              type="button"
              className="rounded-full bg-ink px-3 py-1 font-bold text-paper"
              onClick={() =>
                void run(async () => {
                  const fit = blade.getValues();
                  await shopApi.fitBlade(teamId, cutter.id, { ...fit, price: fit.price || 0 });
                  setFitting(false);
                  onChanged();
                })
              }
            >
              Fitted
            </button>
            <button type="button" className="font-bold underline" onClick={() => setFitting(false)}>
              Cancel
            </button>
          </div>
          {error && (
            <p role="alert" className="text-alarm">
              {error}
            </p>
          )}
        </div>
      )}
      {cutter.blades.length > 1 && (
        <details className="mt-1">
          <summary className="cursor-pointer">Blade log ({cutter.blades.length})</summary>
          <ul>
            {cutter.blades.map((x) => (
              <li key={x.id}>
                {x.fittedOn} → {x.removedOn ?? 'in use'}: {x.label}, {x.cutLengthM.toFixed(1)} m
              </li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}

/** Printers (ink for a fully covered page) and cutters with their blades and wear. */
export function MachinesBench({
  teamId,
  currency,
  canManage,
  canRecord,
}: {
  teamId: string;
  currency: string;
  canManage: boolean;
  canRecord: boolean;
}) {
  const client = useQueryClient();
  const machines = useMachines(teamId);
  const { error, run } = useAction({ preferField: true });
  const [editing, setEditing] = useState<string | null>(null);
  const refresh = () => client.invalidateQueries({ queryKey: shopKeys.all(teamId) });
  const retire = (m: MachineView) =>
    run(async () => {
      if (!window.confirm(`Retire ${m.name}? Runs already logged on it keep its name.`)) return;
      await shopApi.archiveMachine(teamId, m.id);
      await refresh();
    });
  return (
    <section aria-labelledby="machines-title" className="rounded-sticker border-2 border-paper-edge bg-white p-4 text-sm">
      <h2 id="machines-title" className="mb-1 text-lg font-extrabold">
        Machines and blades
      </h2>
      <p className="mb-2 text-xs text-ink-soft">
        While a cutter runs, keep fingers, hair and sleeves clear of the carriage and never reach under it; your machine's manual and local
        rules come first.
      </p>
      <ul className="flex flex-col gap-2">
        {machines.data?.map((m) => (
          <li key={m.id} className="rounded-lg bg-paper px-3 py-2" data-testid={`machine-${m.id}`}>
            <div className="flex flex-wrap items-baseline gap-2">
              <strong>{m.name}</strong> <span className="text-xs text-ink-faint">{m.kind === 'printer' ? 'printer' : 'cutter'}</span>
              {m.kind === 'printer' && m.inkFullPage !== null && (
                <span className="text-xs">Ink for a fully covered page: {formatMoney(m.inkFullPage, currency)}</span>
              )}
              {canManage && (
                <span className="ml-auto flex gap-1 text-xs">
                  <button
                    type="button"
                    className="rounded border-2 border-paper-edge px-2 font-bold"
                    aria-expanded={editing === m.id}
                    onClick={() => setEditing(editing === m.id ? null : m.id)}
                  >
                    Edit<span className="sr-only"> {m.name}</span>
                  </button>
                  <button type="button" className="rounded border-2 border-paper-edge px-2 font-bold" onClick={() => void retire(m)}>
                    Retire<span className="sr-only"> {m.name}</span>
                  </button>
                </span>
              )}
            </div>
            {m.notes && <p className="text-xs text-ink-soft">{m.notes}</p>}
            {editing === m.id && (
              <div className="mt-1 rounded-lg bg-white p-2">
                <MachineForm
                  machine={m}
                  currency={currency}
                  onCancel={() => setEditing(null)}
                  onSave={async (body) => {
                    await shopApi.updateMachine(teamId, m.id, body);
                    setEditing(null);
                    await refresh();
                  }}
                />
              </div>
            )}
            {m.kind === 'cutter' && <BladeLine cutter={m} teamId={teamId} canRecord={canRecord} onChanged={() => void refresh()} />}
          </li>
        ))}
      </ul>
      {machines.data?.length === 0 && <p className="py-2 text-ink-soft">No machines yet.</p>}
      {canManage && (
        <div className="mt-3 border-t border-paper-deep pt-3">
          <MachineForm
            currency={currency}
            onSave={async (body) => {
              await shopApi.createMachine(teamId, body);
              await refresh();
            }}
          />
        </div>
      )}
      {error && (
        <p role="alert" className="mt-2 font-semibold text-alarm">
          {error}
        </p>
      )}
    </section>
  );
}
