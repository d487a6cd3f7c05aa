import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useParams } from 'react-router';
import type { ArtUpdateInput, ArtView, CollectionView } from '@shared/schemas/library';
import { LICENCE_LABELS } from '@shared/schemas/library';
import { formatLength } from '@shared/units';
import { Button, FormMessage } from '@/components/form';
import { PageTitle } from '@/components/page-title';
import { useAction } from '@/hooks/use-action';
import { useMe } from '@/features/auth/api/me';
import { useTeamRole } from '@/features/auth/use-team-role';
import { deleteWithQuestion, useArt, useAttachProof, useDeleteArt, useUpdateArt } from '../api/art';
import { useCollections } from '../api/collections';
import { BackgroundPreview } from '../components/background-preview';
import { LicenceForm } from '../components/licence-form';

export function ArtDetailRoute() {
  const { artId = '' } = useParams();
  const { teamId, can } = useTeamRole();
  const { data: me } = useMe();
  const art = useArt(teamId!, artId);
  const collections = useCollections(teamId!);
  const update = useUpdateArt(teamId!, artId);
  const remove = useDeleteArt(teamId!);
  const proof = useAttachProof(teamId!, { artId });
  const navigate = useNavigate();
  const action = useAction();
  const [saved, setSaved] = useState(false);
  const error = action.error;
  const run = async (work: () => Promise<unknown>) => {
    setSaved(false);
    setSaved(await action.run(work));
  };

  if (art.isPending) return <p>Loading…</p>;
  if (art.isError) return <FormMessage>{art.error.message}</FormMessage>;
  const item = art.data;
  const unit = me?.user.unit ?? 'in';
  const size = (p: { widthMm: number; heightMm: number }) =>
    `${formatLength(p.widthMm, unit, unit === 'in' ? 2 : 0)} × ${formatLength(p.heightMm, unit, unit === 'in' ? 2 : 0)}`;
  const edit = can('library.contribute');

  return (
    <>
      <p className="mb-2 text-sm">
        <Link to=".." relative="path" className="font-bold text-peel-deep underline">
          ← Art library
        </Link>
      </p>
      <PageTitle title={item.name} />
      <FormMessage>{error}</FormMessage>
      {saved && <FormMessage tone="ok">Saved.</FormMessage>}
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <BackgroundPreview teamId={teamId!} art={item} canEdit={edit} />
        <div className="flex flex-col gap-4">
          <section className="rounded-sticker border-2 border-paper-edge bg-white p-5 text-sm">
            <h2 className="mb-2 text-lg font-extrabold">About this art</h2>
            <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
              <dt className="font-bold">Pixels</dt>
              <dd>
                {item.widthPx} × {item.heightPx} ({item.format.toUpperCase()})
              </dd>
              {item.source && (
                <>
                  <dt className="font-bold">Vector original</dt>
                  <dd data-testid="vector-source">
                    Drawn at 300 DPI from an SVG ·{' '}
                    <a href={item.source.url} className="font-bold underline" download>
                      download the SVG
                    </a>
                  </dd>
                </>
              )}
              <dt className="font-bold">Largest at 300 DPI</dt>
              <dd>{size(item.largestPrint.at300)}</dd>
              <dt className="font-bold">Largest at 150 DPI</dt>
              <dd>{size(item.largestPrint.at150)}</dd>
              <dt className="font-bold">Transparency</dt>
              <dd>{item.hasTransparency ? 'Yes' : 'No'}</dd>
              <dt className="font-bold">Licence</dt>
              <dd>
                {item.licence
                  ? `${LICENCE_LABELS[item.licence.kind]}${item.licence.inheritedFrom ? ` (from the pack ${item.licence.inheritedFrom.name})` : ''}`
                  : 'Not recorded'}
              </dd>
              <dt className="font-bold">Added by</dt>
              <dd>
                {item.uploadedBy.name}, {new Date(item.createdAt).toLocaleDateString()}
              </dd>
            </dl>
          </section>
          {edit && (
            <DetailsForm
              item={item}
              collections={collections.data}
              busy={update.isPending}
              onSave={(changes) => (Object.keys(changes).length === 0 ? setSaved(true) : void run(() => update.mutateAsync(changes)))}
            />
          )}
          {can('library.manage') && (
            <section className="rounded-sticker border-2 border-paper-edge bg-white p-5">
              <LicenceForm
                licence={item.licence && !item.licence.inheritedFrom ? item.licence : null}
                hint={
                  item.licence?.inheritedFrom
                    ? `Now from the pack it came in, ${item.licence.inheritedFrom.name}. A licence set here overrides it.`
                    : undefined
                }
                onSave={(licence) => run(() => update.mutateAsync({ licence }))}
                onProof={(file) => run(() => proof.mutateAsync(file))}
              />
            </section>
          )}
          {/* Members remove only their own uploads; owners and admins any (the server's rule). */}
          {edit && (can('library.manage') || item.uploadedBy.id === me?.user.id) && (
            <Button
              variant="danger"
              onClick={() => {
                if (!window.confirm(`Remove “${item.name}” from the library?`)) return;
                void run(async () => {
                  if (await deleteWithQuestion((confirm) => remove.mutateAsync({ artId: item.id, confirm })))
                    navigate('..', { relative: 'path' });
                });
              }}
            >
              Remove from the library
            </Button>
          )}
        </div>
      </div>
    </>
  );
}

/** The art's name, keywords and collections; only what the maker changed is sent (a field left alone is never rewritten). */
function DetailsForm({
  item,
  collections,
  busy,
  onSave,
}: {
  item: ArtView;
  collections: CollectionView[] | undefined;
  busy: boolean;
  onSave: (changes: ArtUpdateInput) => void;
}) {
  const form = useForm({
    defaultValues: { name: item.name, keywords: item.keywords.join(', '), collectionIds: item.collections.map((c) => c.id) },
  });
  const submit = form.handleSubmit((values) => {
    const changes: ArtUpdateInput = {};
    const name = values.name.trim();
    if (name !== item.name) changes.name = name;
    const keywords = values.keywords
      .split(',')
      .map((k) => k.trim())
      .filter(Boolean);
    if (keywords.join('\u0000') !== item.keywords.join('\u0000')) changes.keywords = keywords;
    // Compared only once the list is here: a half-loaded list must never read as "in none".
    if (collections) {
      // One checkbox alone may come back as its value or false rather than a list.
      const raw = values.collectionIds as unknown;
      const chosen = (Array.isArray(raw) ? raw : raw ? [raw] : []).map(String).sort();
      if (
        chosen.join(',') !==
        item.collections
          .map((c) => c.id)
          .sort()
          .join(',')
      )
        changes.collectionIds = chosen;
    }
    onSave(changes);
  });
  return (
    <form className="flex flex-col gap-3 rounded-sticker border-2 border-paper-edge bg-white p-5 text-sm" onSubmit={submit}>
      <h2 className="text-lg font-extrabold">Details</h2>
      <label className="flex flex-col gap-1 font-bold">
        Name
        <input {...form.register('name')} className="rounded border-2 border-paper-edge px-2 py-1 font-normal" />
      </label>
      <label className="flex flex-col gap-1 font-bold">
        Keywords (comma between)
        <input {...form.register('keywords')} className="rounded border-2 border-paper-edge px-2 py-1 font-normal" />
      </label>
      <fieldset className="flex flex-col gap-1" aria-describedby="collections-hint">
        <legend className="font-bold">Collections</legend>
        {/* Shown only once the list is here: a half-loaded list must never read as "in none". */}
        {collections ? (
          collections
            .filter((c) => !c.archived || item.collections.some((m) => m.id === c.id))
            .map((c) => (
              <label key={c.id} className="flex items-center gap-2">
                <input type="checkbox" value={c.id} {...form.register('collectionIds')} />
                {c.name}
              </label>
            ))
        ) : (
          <p className="text-ink-soft" data-testid="collections-loading">
            Loading collections…
          </p>
        )}
        <p id="collections-hint" className="text-xs text-ink-soft">
          Art can be in several collections. Its licence stays with the art
          {item.licence?.inheritedFrom ? ` (from its pack, ${item.licence.inheritedFrom.name})` : ''}, whichever collections it is in.
        </p>
      </fieldset>
      <Button type="submit" busy={busy}>
        Save details
      </Button>
    </form>
  );
}
