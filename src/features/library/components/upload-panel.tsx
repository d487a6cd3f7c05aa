import { useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { DragEvent } from 'react';
import type { CollectionView, UploadResult } from '@shared/schemas/library';
import { Button } from '@/components/form';
import { ApiError } from '@/lib/api-client';
import { useInvalidateLibrary } from '../api/art';
import { uploadArt } from '../api/upload';
import { CollectionSelect } from './collection-select';

type Job = {
  id: number;
  file: File;
  progress: number;
  state: 'waiting' | 'sending' | 'done' | 'failed';
  results: UploadResult[];
  error?: string;
};

const STATUS_TEXT: Record<UploadResult['status'], string> = {
  stored: 'Added',
  duplicate: 'Already in the library',
  rejected: 'Refused',
  skipped: 'Skipped',
};

const ACCEPT = '.png,.jpg,.jpeg,.webp,.svg,.zip,image/png,image/jpeg,image/webp,image/svg+xml,application/zip';

/** Drop or pick many images and zipped packs; each file uploads with its own progress bar. */
export function UploadPanel({ teamId, collections, onClose }: { teamId: string; collections: CollectionView[]; onClose: () => void }) {
  const [jobs, setJobs] = useState<Job[]>([]);
  // What every file of the next upload gets, held in react-hook-form.
  const options = useForm({ defaultValues: { keywords: '', collectionId: '' } });
  const { keywords, collectionId } = options.watch();
  const [dragging, setDragging] = useState(false);
  const picker = useRef<HTMLInputElement>(null);
  const nextId = useRef(1);
  const refresh = useInvalidateLibrary(teamId);
  const busy = jobs.some((j) => j.state === 'sending' || j.state === 'waiting');

  const update = (id: number, change: Partial<Job>) => setJobs((all) => all.map((j) => (j.id === id ? { ...j, ...change } : j)));

  const start = async (files: File[]) => {
    const added = files.map((file) => ({ id: nextId.current++, file, progress: 0, state: 'waiting' as const, results: [] }));
    setJobs((all) => [...all, ...added]);
    // Two at a time: steady progress without flooding the server.
    const queue = [...added];
    const worker = async () => {
      for (let job = queue.shift(); job; job = queue.shift()) {
        update(job.id, { state: 'sending' });
        try {
          const results = await uploadArt(teamId, job.file, { keywords, collectionId }, (progress) => update(job!.id, { progress }));
          update(job.id, { state: 'done', progress: 1, results });
        } catch (error) {
          update(job.id, { state: 'failed', progress: 1, error: error instanceof ApiError ? error.message : 'Upload failed.' });
        }
      }
    };
    await Promise.all([worker(), worker()]);
    refresh();
  };

  const onDrop = (event: DragEvent) => {
    event.preventDefault();
    setDragging(false);
    const files = [...event.dataTransfer.files];
    if (files.length) void start(files);
  };

  const overall = jobs.length ? jobs.reduce((sum, j) => sum + j.progress, 0) / jobs.length : 0;
  const counts = jobs
    .flatMap((j) => j.results)
    .reduce<Record<string, number>>((acc, r) => ({ ...acc, [r.status]: (acc[r.status] ?? 0) + 1 }), {});

  return (
    <section aria-labelledby="upload-title" className="mb-6 rounded-sticker border-2 border-paper-edge bg-white p-5">
      <div className="mb-3 flex items-center justify-between">
        <h2 id="upload-title" className="text-lg font-extrabold">
          Add art
        </h2>
        <button type="button" className="font-bold text-ink-soft underline" onClick={onClose} disabled={busy}>
          Close
        </button>
      </div>
      <div className="mb-4 grid gap-3 md:grid-cols-2">
        <label className="flex flex-col gap-1 text-sm font-bold">
          Keywords for this batch
          <input
            {...options.register('keywords')}
            placeholder="e.g. spring, flowers, watercolour"
            className="rounded-lg border-2 border-paper-edge px-3 py-2 font-normal"
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-bold">
          Put into collection
          <CollectionSelect
            value={collectionId}
            onChange={(id: string) => options.setValue('collectionId', id)}
            collections={collections}
            className="rounded-lg border-2 border-paper-edge bg-white px-3 py-2 font-normal"
          />
        </label>
      </div>
      <div
        role="button"
        tabIndex={0}
        aria-label="Drop images or zipped packs here, or press Enter to choose files"
        onKeyDown={(e) => (e.key === 'Enter' || e.key === ' ') && picker.current?.click()}
        onClick={() => picker.current?.click()}
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={`flex cursor-pointer flex-col items-center justify-center gap-1 rounded-sticker border-2 border-dashed p-8 text-center transition ${dragging ? 'border-peel bg-peel-light' : 'border-ink-faint/40 bg-paper'}`}
      >
        <span className="text-lg font-extrabold">Drop PNG, JPEG, WebP, SVG or zipped packs here</span>
        <span className="text-sm text-ink-soft">
          or click to choose files · folders inside a zip become keywords · SVG is drawn at 300 DPI from its own size
        </span>
      </div>
      <input
        ref={picker}
        type="file"
        multiple
        accept={ACCEPT}
        className="sr-only"
        data-testid="upload-input"
        onChange={(e) => e.target.files && void start([...e.target.files])}
      />

      {jobs.length > 0 && (
        <div className="mt-4 flex flex-col gap-3">
          <div>
            <div className="mb-1 flex justify-between text-sm font-bold">
              <span>All files</span>
              <span data-testid="overall-progress">{Math.round(overall * 100)}%</span>
            </div>
            <progress className="h-3 w-full accent-sage" max={1} value={overall} aria-label="Overall upload progress" />
            {!busy && (
              <p className="mt-1 text-sm text-ink-soft" data-testid="upload-summary" role="status">
                {counts.stored ?? 0} added · {counts.duplicate ?? 0} already in the library ·{' '}
                {(counts.rejected ?? 0) + jobs.filter((j) => j.state === 'failed').length} refused · {counts.skipped ?? 0} skipped
              </p>
            )}
          </div>
          <ul className="flex max-h-80 flex-col gap-2 overflow-auto">
            {jobs.map((job) => (
              <li key={job.id} className="rounded-lg bg-paper px-3 py-2 text-sm">
                <div className="flex justify-between gap-3">
                  <span className="truncate font-bold">{job.file.name}</span>
                  <span>{job.state === 'failed' ? 'Refused' : job.state === 'done' ? 'Done' : `${Math.round(job.progress * 100)}%`}</span>
                </div>
                <progress className="h-2 w-full accent-peel" max={1} value={job.progress} aria-label={`Upload of ${job.file.name}`} />
                {job.error && <p className="font-semibold text-alarm">{job.error}</p>}
                {job.results.length > 0 && (job.results.length > 1 || job.results[0].status !== 'stored') && (
                  <ul className="mt-1 text-xs">
                    {job.results.map((r) => (
                      <li key={r.file} className={r.status === 'rejected' ? 'text-alarm' : 'text-ink-soft'}>
                        {r.file}: {STATUS_TEXT[r.status]}
                        {r.reason ? ` (${r.reason})` : ''}
                      </li>
                    ))}
                  </ul>
                )}
              </li>
            ))}
          </ul>
          {!busy && (
            <Button variant="quiet" onClick={() => setJobs([])}>
              Clear the list
            </Button>
          )}
        </div>
      )}
    </section>
  );
}
