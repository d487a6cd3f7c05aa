import { useForm } from 'react-hook-form';
import { useState } from 'react';
import type { CollectionView } from '@shared/schemas/library';
import { ApiError } from '@/lib/api-client';
import { deleteWithQuestion, useBulkArt } from '../api/art';

/** Actions on every selected item at once. */
export function BulkBar({
  teamId,
  ids,
  collections,
  onDone,
}: {
  teamId: string;
  ids: string[];
  collections: CollectionView[];
  onDone: () => void;
}) {
  const bulk = useBulkArt(teamId);
  // The keyword and the collection the bulk actions use, held in react-hook-form.
  const choice = useForm({ defaultValues: { keyword: '', target: '' } });
  const { keyword, target } = choice.watch();
  const [message, setMessage] = useState<string | null>(null);
  const run = async (action: Parameters<typeof bulk.mutateAsync>[0], done: string) => {
    setMessage(null);
    try {
      await bulk.mutateAsync(action);
      setMessage(done);
      onDone();
    } catch (error) {
      setMessage(error instanceof ApiError ? error.message : 'That did not work.');
    }
  };
  return (
    <section
      aria-label="Actions on the selected art"
      className="sticky top-0 z-20 mb-4 flex flex-wrap items-center gap-2 rounded-sticker border-2 border-peel bg-peel-light p-3 text-sm"
    >
      <strong>{ids.length} selected</strong>
      <input
        {...choice.register('keyword')}
        placeholder="keyword"
        aria-label="Keyword for the selected art"
        className="rounded border-2 border-paper-edge px-2 py-1"
      />
      <button
        type="button"
        disabled={!keyword.trim()}
        className="rounded-full bg-ink px-3 py-1 font-bold text-paper disabled:opacity-50"
        onClick={() => run({ action: 'addKeyword', ids, keyword }, `Added “${keyword}”.`)}
      >
        Add keyword
      </button>
      <button
        type="button"
        disabled={!keyword.trim()}
        className="rounded-full border-2 border-ink px-3 py-1 font-bold disabled:opacity-50"
        onClick={() => run({ action: 'removeKeyword', ids, keyword }, `Removed “${keyword}”.`)}
      >
        Remove keyword
      </button>
      <select
        {...choice.register('target')}
        aria-label="Move to collection"
        className="rounded border-2 border-paper-edge bg-white px-2 py-1"
      >
        <option value="">Move to…</option>
        <option value="none">No collection</option>
        {collections
          .filter((c) => !c.archived)
          .map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
      </select>
      <button
        type="button"
        disabled={!target}
        className="rounded-full border-2 border-ink px-3 py-1 font-bold disabled:opacity-50"
        onClick={() => run({ action: 'move', ids, collectionId: target === 'none' ? null : target }, 'Moved.')}
      >
        Move
      </button>
      <button
        type="button"
        className="ml-auto rounded-full bg-alarm px-3 py-1 font-bold text-white"
        onClick={() => {
          if (!window.confirm(`Remove ${ids.length} item(s) from the library?`)) return;
          void deleteWithQuestion((confirm) => bulk.mutateAsync({ action: 'delete', ids, confirm }))
            .then((done) => {
              if (done) {
                setMessage('Removed from the library.');
                onDone();
              }
            })
            .catch((error) => setMessage(error instanceof ApiError ? error.message : 'That did not work.'));
        }}
      >
        Delete
      </button>
      {message && (
        <p role="status" className="w-full font-semibold">
          {message}
        </p>
      )}
    </section>
  );
}
