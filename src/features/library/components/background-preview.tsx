import { useEffect, useRef, useState } from 'react';
import type { MouseEvent } from 'react';
import type { ArtView } from '../../../../shared/schemas/library';
import { FormMessage } from '../../../components/form';
import { useUpdateArt } from '../api/art';
import { useOutlinePreview } from '../api/outline-preview';

const hex = (r: number, g: number, b: number) => `#${[r, g, b].map((v) => v.toString(16).padStart(2, '0')).join('')}`;

/**
 * Before/after of the outline engine's background removal for art without transparency: the
 * tolerance is a slider, and clicking the original picks the colour to remove.
 */
export function BackgroundPreview({ teamId, art, canEdit }: { teamId: string; art: ArtView; canEdit: boolean }) {
  const [mode, setMode] = useState(art.background.mode);
  const [colour, setColour] = useState(art.background.colour ?? '#ffffff');
  const [tolerance, setTolerance] = useState(art.background.tolerance);
  const [debounced, setDebounced] = useState({ mode, colour, tolerance });
  const canvas = useRef<HTMLCanvasElement | null>(null);
  const save = useUpdateArt(teamId, art.id);

  useEffect(() => {
    const t = setTimeout(() => setDebounced({ mode, colour, tolerance }), 300);
    return () => clearTimeout(t);
  }, [mode, colour, tolerance]);

  const background = debounced.mode === 'colour' ? debounced.colour : debounced.mode;
  const preview = useOutlinePreview(teamId, art.id, { background, backgroundTolerance: debounced.tolerance });

  const pick = (event: MouseEvent<HTMLImageElement>) => {
    const img = event.currentTarget;
    const c = (canvas.current ??= document.createElement('canvas'));
    c.width = img.naturalWidth;
    c.height = img.naturalHeight;
    const ctx = c.getContext('2d', { willReadFrequently: true })!;
    ctx.drawImage(img, 0, 0);
    const rect = img.getBoundingClientRect();
    const x = Math.floor(((event.clientX - rect.left) / rect.width) * img.naturalWidth);
    const y = Math.floor(((event.clientY - rect.top) / rect.height) * img.naturalHeight);
    const [r, g, b] = ctx.getImageData(x, y, 1, 1).data;
    setColour(hex(r, g, b));
    setMode('colour');
  };

  return (
    <section aria-labelledby="bg-title" className="rounded-sticker border-2 border-paper-edge bg-white p-5">
      <h2 id="bg-title" className="text-lg font-extrabold">Background</h2>
      <p className="mb-3 text-sm text-ink-soft">
        {art.hasTransparency
          ? 'This art has transparency, so its outline follows it. You can still remove a colour.'
          : 'This art has no transparency. Sheetsmith removes the flat background around it; check the result.'}
      </p>
      <div className="grid gap-4 md:grid-cols-2">
        <figure>
          <figcaption className="mb-1 text-sm font-bold">Before {canEdit && '(click to pick the colour to remove)'}</figcaption>
          <img
            src={art.fileUrl}
            alt={`${art.name}, as uploaded`}
            onClick={canEdit ? pick : undefined}
            className={`max-h-72 w-full rounded-lg bg-[repeating-conic-gradient(#f6ead8_0_25%,#fff_0_50%)] bg-[length:16px_16px] object-contain ${canEdit ? 'cursor-crosshair' : ''}`}
          />
        </figure>
        <figure>
          <figcaption className="mb-1 text-sm font-bold">After: the sticker with a 1/8 in border {preview.isFetching && '· updating…'}</figcaption>
          {preview.data?.pieces[0] ? (
            <img src={preview.data.pieces[0].pngUrl} alt={`${art.name} as a sticker`} data-testid="after-preview" className="max-h-72 w-full rounded-lg bg-[#9aa8a8] object-contain p-2" />
          ) : (
            <div className="flex h-72 items-center justify-center rounded-lg bg-paper text-sm">{preview.isError ? '' : 'Working…'}</div>
          )}
          {preview.isError && <FormMessage>{preview.error.message}</FormMessage>}
        </figure>
      </div>
      {canEdit && (
        <div className="mt-4 flex flex-wrap items-center gap-4 text-sm">
          <fieldset className="flex gap-3">
            <legend className="sr-only">How to find the art</legend>
            {(['auto', 'keep', 'colour'] as const).map((m) => (
              <label key={m} className="flex items-center gap-1 font-bold">
                <input type="radio" name="bg-mode" checked={mode === m} onChange={() => setMode(m)} />
                {m === 'auto' ? 'Automatic' : m === 'keep' ? 'Keep everything' : 'Remove a colour'}
              </label>
            ))}
          </fieldset>
          {mode === 'colour' && (
            <label className="flex items-center gap-2 font-bold">
              Colour
              <input type="color" value={colour} onChange={(e) => setColour(e.target.value)} aria-label="Colour to remove" />
              <code>{colour}</code>
            </label>
          )}
          {mode !== 'keep' && (
            <label className="flex items-center gap-2 font-bold">
              Tolerance
              <input type="range" min={0} max={120} value={tolerance} onChange={(e) => setTolerance(Number(e.target.value))} aria-valuetext={`${tolerance}`} />
              <span className="w-8 tabular-nums">{tolerance}</span>
            </label>
          )}
          <button
            type="button"
            className="rounded-full bg-ink px-4 py-1 font-bold text-paper"
            onClick={() => save.mutate({ background: { mode, colour: mode === 'colour' ? colour : null, tolerance } })}
          >
            Use for this art
          </button>
          {save.isSuccess && <span role="status" className="text-sage-deep">Saved: sheets use this setting.</span>}
        </div>
      )}
    </section>
  );
}
