import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { CollectionView } from '@shared/schemas/library';
import { LICENCE_LABELS } from '@shared/schemas/library';
import { useAction } from '@/hooks/use-action';
import type { LicenceInput } from '@shared/schemas/library';
import { useAttachProof } from '../api/art';
import { useCreateCollection, useReorderCollections, useUpdateCollection } from '../api/collections';
import { LicenceForm } from './licence-form';

type Props = {
  teamId: string;
  collections: CollectionView[];
  selected: string | undefined;
  onSelect: (id: string | undefined) => void;
  canManage: boolean;
};

const itemClass = (active: boolean) =>
  `flex w-full items-center justify-between rounded-lg px-3 py-2 text-left text-sm font-bold ${active ? 'bg-ink text-paper' : 'hover:bg-paper-deep'}`;

/** The team's shared collections; owners and admins create, rename, archive, reorder and license them. */
export function CollectionsSidebar({ teamId, collections, selected, onSelect, canManage }: Props) {
  const create = useCreateCollection(teamId);
  const update = useUpdateCollection(teamId);
  const reorder = useReorderCollections(teamId);
  const adding = useForm({ defaultValues: { name: '' } });
  const { error, run } = useAction({ preferField: true });
  const [editing, setEditing] = useState<string | null>(null);
  const active = collections.filter((c) => !c.archived);
  const archived = collections.filter((c) => c.archived);

  const move = (id: string, by: -1 | 1) => {
    const ids = collections.map((c) => c.id);
    const i = ids.indexOf(id);
    const j = i + by;
    if (j < 0 || j >= ids.length) return;
    [ids[i], ids[j]] = [ids[j], ids[i]];
    void run(() => reorder.mutateAsync(ids));
  };

  const row = (c: CollectionView) => (
    <li key={c.id}>
      <div className="flex items-center gap-1">
        <button type="button" className={itemClass(selected === c.id)} onClick={() => onSelect(c.id)} aria-pressed={selected === c.id}>
          <span className={c.archived ? 'italic opacity-70' : ''}>{c.name}</span>
          <span className="text-xs opacity-70">{c.artCount}</span>
        </button>
        {canManage && (
          <button
            type="button"
            className="rounded px-2 text-ink-soft hover:bg-paper-deep"
            aria-label={`Settings of ${c.name}`}
            aria-expanded={editing === c.id}
            onClick={() => setEditing(editing === c.id ? null : c.id)}
          >
            ⚙
          </button>
        )}
      </div>
      {c.licence && <p className="px-3 text-xs text-ink-faint">{LICENCE_LABELS[c.licence.kind]}</p>}
      {canManage && editing === c.id && (
        <div className="mt-2 flex flex-col gap-2 rounded-lg border-2 border-paper-edge bg-white p-3 text-sm">
          <RenameForm name={c.name} onRename={(value) => void run(() => update.mutateAsync({ id: c.id, name: value }))} />
          <label className="flex items-center gap-2">
            <input
              type="checkbox"
              checked={c.membersCanAdd}
              onChange={(e) => void run(() => update.mutateAsync({ id: c.id, membersCanAdd: e.target.checked }))}
            />
            Members may add art
          </label>
          <div className="flex flex-wrap gap-2">
            <button
              type="button"
              className="rounded border-2 border-paper-edge px-2"
              onClick={() => move(c.id, -1)}
              aria-label={`Move ${c.name} up`}
            >
              ↑ Up
            </button>
            <button
              type="button"
              className="rounded border-2 border-paper-edge px-2"
              onClick={() => move(c.id, 1)}
              aria-label={`Move ${c.name} down`}
            >
              ↓ Down
            </button>
            <button
              type="button"
              className="rounded border-2 border-paper-edge px-2"
              onClick={() => void run(() => update.mutateAsync({ id: c.id, archived: !c.archived }))}
            >
              {c.archived ? 'Restore' : 'Archive'}
            </button>
          </div>
          <CollectionLicence teamId={teamId} collection={c} run={run} save={(licence) => update.mutateAsync({ id: c.id, licence })} />
        </div>
      )}
    </li>
  );

  return (
    <nav aria-label="Collections" className="flex flex-col gap-2">
      <h2 className="px-1 text-xs font-extrabold uppercase tracking-wide text-ink-faint">Collections</h2>
      <ul className="flex flex-col gap-1">
        <li>
          <button
            type="button"
            className={itemClass(selected === undefined)}
            onClick={() => onSelect(undefined)}
            aria-pressed={selected === undefined}
          >
            All art
          </button>
        </li>
        <li>
          <button
            type="button"
            className={itemClass(selected === 'none')}
            onClick={() => onSelect('none')}
            aria-pressed={selected === 'none'}
          >
            Not in a collection
          </button>
        </li>
        {active.map(row)}
      </ul>
      {archived.length > 0 && (
        <>
          <h3 className="mt-2 px-1 text-xs font-extrabold uppercase tracking-wide text-ink-faint">Archived</h3>
          <ul className="flex flex-col gap-1">{archived.map(row)}</ul>
        </>
      )}
      {canManage && (
        <form
          className="mt-2 flex gap-1"
          onSubmit={adding.handleSubmit(
            ({ name }) =>
              void run(async () => {
                await create.mutateAsync({ name });
                adding.reset({ name: '' });
              }),
          )}
        >
          <input
            {...adding.register('name')}
            placeholder="New collection"
            aria-label="New collection name"
            className="min-w-0 flex-1 rounded-lg border-2 border-paper-edge px-2 py-1 text-sm"
          />
          <button type="submit" className="rounded-lg bg-ink px-3 text-sm font-bold text-paper">
            Add
          </button>
        </form>
      )}
      {error && (
        <p role="alert" className="text-sm font-semibold text-alarm">
          {error}
        </p>
      )}
    </nav>
  );
}

function CollectionLicence({
  teamId,
  collection,
  run,
  save,
}: {
  teamId: string;
  collection: CollectionView;
  run: (action: () => Promise<unknown>) => Promise<unknown>;
  save: (licence: LicenceInput | null) => Promise<unknown>;
}) {
  const proof = useAttachProof(teamId, { collectionId: collection.id });
  return (
    <LicenceForm
      licence={collection.licence}
      onSave={(licence) => run(() => save(licence))}
      onProof={(file) => run(() => proof.mutateAsync(file))}
      hint="Art in this collection inherits this licence unless it has its own."
    />
  );
}

/** Renames a collection (the server names a bad name; what was typed stays). */
function RenameForm({ name, onRename }: { name: string; onRename: (name: string) => void }) {
  const form = useForm({ defaultValues: { name } });
  return (
    <form className="flex gap-1" onSubmit={form.handleSubmit((values) => onRename(values.name))}>
      <input
        {...form.register('name')}
        aria-label="Collection name"
        className="min-w-0 flex-1 rounded border-2 border-paper-edge px-2 py-1"
      />
      <button type="submit" className="rounded bg-ink px-2 font-bold text-paper">
        Rename
      </button>
    </form>
  );
}
