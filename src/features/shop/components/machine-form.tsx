import { useForm } from 'react-hook-form';
import { formatMoney, fullCoverageCost } from '@shared/production/cost';
import type { MachineView } from '@shared/schemas/shop';
import { useAction } from '@/hooks/use-action';

const input = 'rounded border-2 border-paper-edge px-2 py-1 font-normal';

type MachineBody = { kind: 'printer' | 'cutter'; name: string; notes: string; inkFullPage: number | null };

/**
 * Adds a machine (no `machine`) or edits one. A printer's ink for a fully covered page comes from
 * its cartridge set price and rated yield; when editing, leaving those blank keeps the figure it has.
 */
export function MachineForm({
  machine,
  currency,
  onSave,
  onCancel,
}: {
  machine?: MachineView;
  currency: string;
  onSave: (body: MachineBody) => Promise<unknown>;
  onCancel?: () => void;
}) {
  // The values as typed live in react-hook-form; the server validates the body (shared schema) and names a bad field.
  const form = useForm({
    defaultValues: {
      kind: machine?.kind ?? 'printer',
      name: machine?.name ?? '',
      notes: machine?.notes ?? '',
      cartridge: '',
      yieldPages: '',
    },
  });
  const f = form.watch();
  const { error, run } = useAction({ preferField: true });
  const worked = Number(f.cartridge) > 0 && Number(f.yieldPages) > 0 ? fullCoverageCost(Number(f.cartridge), Number(f.yieldPages)) : null;
  const ink = worked ?? machine?.inkFullPage ?? null;
  const field = (key: 'name' | 'notes' | 'cartridge' | 'yieldPages', label: string, w: string) => (
    <label className="flex flex-col font-bold">
      {label}
      <input {...form.register(key)} className={`${input} ${w}`} />
    </label>
  );
  const submit = () =>
    run(async () => {
      await onSave({ kind: f.kind, name: f.name, notes: f.notes, inkFullPage: f.kind === 'printer' ? ink : null });
      if (!machine) form.reset({ ...f, name: '', notes: '', cartridge: '', yieldPages: '' });
    });
  return (
    <form
      aria-label={machine ? `Edit ${machine.name}` : 'Add a machine'}
      className="flex flex-wrap items-end gap-2 text-xs"
      onSubmit={form.handleSubmit(() => void submit())}
    >
      {!machine && (
        <label className="flex flex-col font-bold">
          Kind
          <select {...form.register('kind')} className={input}>
            <option value="printer">Printer</option>
            <option value="cutter">Cutter</option>
          </select>
        </label>
      )}
      {field('name', 'Name', 'w-40')}
      {f.kind === 'printer' && (
        <>
          {field('cartridge', `Cartridge set price (${currency})`, 'w-20')}
          {field('yieldPages', 'Rated yield (pages)', 'w-20')}
        </>
      )}
      {field('notes', 'Notes', 'w-48')}
      <button type="submit" className="rounded-full bg-ink px-4 py-1 font-bold text-paper">
        {machine ? 'Save machine' : 'Add machine'}
      </button>
      {onCancel && (
        <button type="button" className="font-bold underline" onClick={onCancel}>
          Cancel
        </button>
      )}
      {f.kind === 'printer' && (
        <p className="basis-full text-ink-soft" data-testid="ink-full-page">
          Ink for a fully covered page: {ink === null ? '— (give the cartridge set price and its rated yield)' : formatMoney(ink, currency)}
          {worked === null && ink !== null ? ' (as now)' : ''}. Yields are rated at about 5 % coverage, so a full page costs about 20 pages’
          worth.
        </p>
      )}
      {error && (
        <p role="alert" className="basis-full font-semibold text-alarm">
          {error}
        </p>
      )}
    </form>
  );
}
