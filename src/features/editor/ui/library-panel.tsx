import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import type { ArtPage, ArtView } from '@shared/schemas/library';
import { useCollections } from '@/api/collections';
import { api } from '@/lib/api-client';

/** Default printed width for new art: 2 in, or less when the file is too small for 300 DPI. */
export const defaultWidthMm = (art: { widthPx: number }) => Math.max(12.7, Math.min(50.8, (art.widthPx / 300) * 25.4));

/**
 * The library's search (names, keywords, collections; typos forgiven) and a collection to look in,
 * with art to drag onto the sheet (or add with a button, for the keyboard).
 */
export function LibraryPanel({ teamId, canEdit, onAdd }: { teamId: string; canEdit: boolean; onAdd: (art: ArtView) => void }) {
  const [q, setQ] = useState('');
  const [collectionId, setCollectionId] = useState('');
  const collections = useCollections(teamId);
  const art = useQuery({
    queryKey: ['teams', teamId, 'art', 'list', { q, collectionId, pageSize: 60, panel: true }],
    queryFn: () =>
      api<ArtPage>(
        'GET',
        `/teams/${teamId}/art?pageSize=60&q=${encodeURIComponent(q)}${collectionId ? `&collectionId=${collectionId}` : ''}`,
      ),
  });
  return (
    <aside aria-label="Art to place" className="flex min-h-0 flex-col gap-2 rounded-sticker border-2 border-paper-edge bg-white p-3">
      <input
        type="search"
        value={q}
        onChange={(e) => setQ(e.target.value)}
        placeholder="Find art"
        aria-label="Find art to place"
        className="rounded-lg border-2 border-paper-edge px-2 py-1 text-sm"
      />
      <select
        aria-label="Collection to look in"
        value={collectionId}
        onChange={(e) => setCollectionId(e.target.value)}
        className="rounded-lg border-2 border-paper-edge bg-white px-1 py-1 text-sm"
      >
        <option value="">All collections</option>
        {(collections.data ?? [])
          .filter((c) => !c.archived)
          .map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        <option value="none">In no collection</option>
      </select>
      {art.data?.suggestion && (
        <p className="text-xs" data-testid="panel-did-you-mean">
          {art.data.total > 0 ? 'Also near spellings: ' : 'Did you mean '}
          <button type="button" className="font-bold underline" onClick={() => setQ(art.data.suggestion!)}>
            {art.data.suggestion}
          </button>
          {art.data.total > 0 ? '' : '?'}
        </p>
      )}
      <ul className="grid min-h-0 grid-cols-2 gap-2 overflow-auto" data-testid="library-panel">
        {art.data?.items.map((item) => (
          <li
            key={item.id}
            draggable={canEdit}
            onDragStart={(e) => {
              e.dataTransfer.setData(
                'application/x-sheetsmith-art',
                JSON.stringify({ artId: item.id, widthPx: item.widthPx, name: item.name }),
              );
              e.dataTransfer.effectAllowed = 'copy';
            }}
            className="flex cursor-grab flex-col items-center rounded-lg border border-paper-edge p-1 text-center text-xs"
            data-art-name={item.name}
          >
            <img src={item.thumbnailUrl} alt="" className="h-16 w-16 object-contain" draggable={false} />
            <span className="w-full truncate">{item.name}</span>
            {canEdit && (
              <button
                type="button"
                className="font-bold text-peel-deep underline"
                onClick={() => onAdd(item)}
                aria-label={`Add ${item.name} to the sheet`}
              >
                Add
              </button>
            )}
          </li>
        ))}
      </ul>
      {art.data && art.data.items.length === 0 && <p className="text-sm text-ink-soft">No art matches.</p>}
    </aside>
  );
}
