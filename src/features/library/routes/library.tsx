import { useEffect, useMemo, useState } from 'react';
import { useSearchParams } from 'react-router';
import { LICENCE_KINDS, LICENCE_LABELS } from '@shared/schemas/library';
import { Button, FormMessage } from '@/components/form';
import { EmptyState, PageTitle } from '@/components/page-title';
import { useMe } from '@/features/auth/api/me';
import { useTeamRole } from '@/features/auth/use-team-role';
import type { ArtFilters } from '../api/art';
import { useArtList } from '../api/art';
import { useCollections } from '../api/collections';
import { useMembers } from '../api/members';
import { ArtGrid, ArtTable } from '../components/art-results';
import { BulkBar } from '../components/bulk-bar';
import { CollectionsSidebar } from '../components/collections-sidebar';
import { UploadPanel } from '../components/upload-panel';
import { MakePanel } from '../components/make-panel';

const PAGE_SIZE = 24;
const select = 'rounded-lg border-2 border-paper-edge bg-white px-2 py-1 text-sm';

export function LibraryRoute() {
  const { teamId, can } = useTeamRole();
  const { data: me } = useMe();
  const [params, setParams] = useSearchParams();
  const [uploading, setUploading] = useState(false);
  const [making, setMaking] = useState(false);
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const [text, setText] = useState(params.get('q') ?? '');
  const collections = useCollections(teamId!);
  const members = useMembers(teamId!);
  const view = params.get('view') === 'table' ? 'table' : 'grid';

  const filters: ArtFilters = useMemo(
    () => ({
      q: params.get('q') ?? '',
      collectionId: (params.get('collectionId') as ArtFilters['collectionId']) ?? undefined,
      licence: (params.get('licence') as ArtFilters['licence']) ?? undefined,
      transparency: (params.get('transparency') as ArtFilters['transparency']) ?? undefined,
      uploadedBy: params.get('uploadedBy') ?? undefined,
      from: params.get('from') ?? undefined,
      to: params.get('to') ?? undefined,
      sort: (params.get('sort') as ArtFilters['sort']) ?? 'relevance',
      dir: (params.get('dir') as ArtFilters['dir']) ?? 'desc',
      page: Number(params.get('page') ?? 1),
      pageSize: PAGE_SIZE,
    }),
    [params],
  );
  const list = useArtList(teamId!, filters);

  const setParam = (changes: Record<string, string | undefined>) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(changes)) {
      if (v === undefined || v === '') next.delete(k);
      else next.set(k, v);
    }
    if (!('page' in changes)) next.delete('page');
    setParams(next, { replace: true });
    setSelected(new Set());
  };

  // The search box asks the server once typing pauses, not on every key.
  useEffect(() => {
    const handle = setTimeout(() => (text !== (params.get('q') ?? '') ? setParam({ q: text }) : undefined), 250);
    return () => clearTimeout(handle);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [text]);

  const items = list.data?.items ?? [];
  const total = list.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const toggle = (id: string) =>
    setSelected((s) => {
      const next = new Set(s);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });

  return (
    <>
      <PageTitle title="Art library">
        {can('library.contribute') && !uploading && <Button onClick={() => setUploading(true)}>Add art</Button>}
        {can('library.contribute') && !making && (
          <Button variant="quiet" onClick={() => setMaking(true)}>
            Make a sticker…
          </Button>
        )}
      </PageTitle>
      {making && (
        <MakePanel teamId={teamId!} unit={me?.user.unit ?? 'in'} collections={collections.data ?? []} onClose={() => setMaking(false)} />
      )}
      {uploading && <UploadPanel teamId={teamId!} collections={collections.data ?? []} onClose={() => setUploading(false)} />}
      <div className="grid gap-6 lg:grid-cols-[15rem_1fr]">
        <CollectionsSidebar
          teamId={teamId!}
          collections={collections.data ?? []}
          selected={filters.collectionId}
          onSelect={(id) => setParam({ collectionId: id })}
          canManage={can('library.manage')}
        />
        <div className="min-w-0">
          <div className="mb-4 flex flex-wrap items-end gap-2" role="search">
            <label className="flex min-w-[14rem] flex-1 flex-col text-sm font-bold">
              Find art
              <input
                type="search"
                value={text}
                onChange={(e) => setText(e.target.value)}
                placeholder="name, keyword or collection — e.g. tulips, sun-flower"
                className="rounded-lg border-2 border-paper-edge px-3 py-2 font-normal"
              />
            </label>
            <select
              aria-label="Licence"
              className={select}
              value={filters.licence ?? ''}
              onChange={(e) => setParam({ licence: e.target.value })}
            >
              <option value="">Any licence</option>
              {LICENCE_KINDS.map((k) => (
                <option key={k} value={k}>
                  {LICENCE_LABELS[k]}
                </option>
              ))}
              <option value="none">No licence recorded</option>
            </select>
            <select
              aria-label="Transparency"
              className={select}
              value={filters.transparency ?? ''}
              onChange={(e) => setParam({ transparency: e.target.value })}
            >
              <option value="">With or without transparency</option>
              <option value="yes">Has transparency</option>
              <option value="no">No transparency</option>
            </select>
            <select
              aria-label="Uploaded by"
              className={select}
              value={filters.uploadedBy ?? ''}
              onChange={(e) => setParam({ uploadedBy: e.target.value })}
            >
              <option value="">Anyone</option>
              {members.data?.map((m) => (
                <option key={m.userId} value={m.userId}>
                  {m.name}
                </option>
              ))}
            </select>
            <label className="flex flex-col text-xs font-bold">
              Added from
              <input type="date" className={select} value={filters.from ?? ''} onChange={(e) => setParam({ from: e.target.value })} />
            </label>
            <label className="flex flex-col text-xs font-bold">
              to
              <input type="date" className={select} value={filters.to ?? ''} onChange={(e) => setParam({ to: e.target.value })} />
            </label>
            <select
              aria-label="Sort by"
              className={select}
              value={`${filters.sort}:${filters.dir}`}
              onChange={(e) => {
                const [sort, dir] = e.target.value.split(':');
                setParam({ sort, dir });
              }}
            >
              <option value="relevance:desc">Best match</option>
              <option value="created:desc">Newest first</option>
              <option value="created:asc">Oldest first</option>
              <option value="name:asc">Name A–Z</option>
              <option value="name:desc">Name Z–A</option>
              <option value="pixels:desc">Most pixels</option>
              <option value="size:desc">Largest file</option>
            </select>
            <div role="group" aria-label="View" className="flex overflow-hidden rounded-lg border-2 border-paper-edge text-sm font-bold">
              <button
                type="button"
                aria-pressed={view === 'grid'}
                className={`px-3 py-1 ${view === 'grid' ? 'bg-ink text-paper' : 'bg-white'}`}
                onClick={() => setParam({ view: undefined, page: params.get('page') ?? undefined })}
              >
                Grid
              </button>
              <button
                type="button"
                aria-pressed={view === 'table'}
                className={`px-3 py-1 ${view === 'table' ? 'bg-ink text-paper' : 'bg-white'}`}
                onClick={() => setParam({ view: 'table', page: params.get('page') ?? undefined })}
              >
                Table
              </button>
            </div>
          </div>
          {can('library.contribute') && selected.size > 0 && (
            <BulkBar teamId={teamId!} ids={[...selected]} collections={collections.data ?? []} onDone={() => setSelected(new Set())} />
          )}
          {list.isError && <FormMessage>{list.error.message}</FormMessage>}
          <p className="mb-2 text-sm text-ink-soft" role="status" data-testid="result-count">
            {list.isPending ? 'Looking…' : `${total} piece${total === 1 ? '' : 's'} of art`}
          </p>
          {!list.isPending && list.data?.suggestion && (
            <p className="mb-2 text-sm" data-testid="did-you-mean">
              {total > 0 ? 'Including near spellings, such as ' : 'Did you mean '}
              <button type="button" className="font-bold underline" onClick={() => setText(list.data!.suggestion!)}>
                {list.data.suggestion}
              </button>
              {total > 0 ? '.' : '?'}
            </p>
          )}
          {!list.isPending && total === 0 ? (
            <EmptyState title={filters.q ? 'Nothing matches' : 'Your shelf is empty'}>
              {filters.q
                ? 'Try a shorter word or another keyword. Small typos are forgiven in words of four letters or more.'
                : can('library.contribute')
                  ? 'Add art: single images or a whole zipped pack at once.'
                  : 'Teammates have not added art yet.'}
            </EmptyState>
          ) : view === 'grid' ? (
            <ArtGrid
              items={items}
              unit={me?.user.unit ?? 'in'}
              selected={selected}
              onToggle={toggle}
              onToggleAll={() => undefined}
              sort={filters.sort!}
              dir={filters.dir!}
              onSort={() => undefined}
            />
          ) : (
            <ArtTable
              items={items}
              unit={me?.user.unit ?? 'in'}
              selected={selected}
              onToggle={toggle}
              onToggleAll={() => setSelected(items.every((i) => selected.has(i.id)) ? new Set() : new Set(items.map((i) => i.id)))}
              sort={filters.sort!}
              dir={filters.dir!}
              onSort={(sort) => setParam({ sort, dir: filters.sort === sort && filters.dir === 'asc' ? 'desc' : 'asc' })}
            />
          )}
          {pages > 1 && (
            <nav aria-label="Pages" className="mt-4 flex items-center justify-center gap-3">
              <Button variant="quiet" disabled={filters.page! <= 1} onClick={() => setParam({ page: String(filters.page! - 1) })}>
                Previous
              </Button>
              <span className="text-sm font-bold">
                Page {filters.page} of {pages}
              </span>
              <Button variant="quiet" disabled={filters.page! >= pages} onClick={() => setParam({ page: String(filters.page! + 1) })}>
                Next
              </Button>
            </nav>
          )}
        </div>
      </div>
    </>
  );
}
