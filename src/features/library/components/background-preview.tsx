import { useEffect, useRef, useState } from 'react';
import type { MouseEvent } from 'react';
import type { ArtView } from '@shared/schemas/library';
import { DEFAULT_TOLERANCE } from '@shared/schemas/outline';
import { FormMessage } from '@/components/form';
import { useUpdateArt } from '../api/art';
import { removalPreviewUrl, useOutlinePreview } from '../api/outline-preview';

const hex = (r: number, g: number, b: number) => `#${[r, g, b].map((v) => v.toString(16).padStart(2, '0')).join('')}`;

type Mode = ArtView['background']['mode'];

/** A mode's starting tolerance: the art's saved one for its saved mode, else the mode's own default (none carries over). */
const toleranceFor = (art: ArtView, mode: Mode) =>
  mode === art.background.mode ? art.background.tolerance : mode === 'colour' ? DEFAULT_TOLERANCE.colour : DEFAULT_TOLERANCE.auto;

/**
 * Before, what is removed and after, for the outline engine's background removal: the tolerance is a
 * slider, clicking the original picks the colour to remove, and the middle picture tints what goes
 * (blue-grey the background, magenta any art the removal would take). Also where the maker agrees
 * that narrow parts of the cut line may be widened.
 */
export function BackgroundPreview({ teamId, art, canEdit }: { teamId: string; art: ArtView; canEdit: boolean }) {
  const [mode, setModeState] = useState<Mode>(art.background.mode);
  const [colour, setColour] = useState(art.background.colour ?? '#ffffff');
  const [tolerance, setTolerance] = useState(art.background.tolerance);
  const [widenNecks, setWidenNecks] = useState(art.widenNecks);
  const [debounced, setDebounced] = useState({ mode, colour, tolerance });
  const canvas = useRef<HTMLCanvasElement | null>(null);
  const save = useUpdateArt(teamId, art.id);
  const setMode = (next: Mode) => {
    if (next === mode) return;
    setModeState(next);
    setTolerance(toleranceFor(art, next));
  };

  useEffect(() => {
    const t = setTimeout(() => setDebounced({ mode, colour, tolerance }), 300);
    return () => clearTimeout(t);
  }, [mode, colour, tolerance]);

  const background = debounced.mode === 'colour' ? debounced.colour : debounced.mode;
  const preview = useOutlinePreview(teamId, art.id, { background, backgroundTolerance: debounced.tolerance, widenNecks });
  const cautions = (preview.data?.warnings ?? []).filter((w) => w.severity === 'warning');
  const showRemoval = canEdit && debounced.mode !== 'keep';

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
      <h2 id="bg-title" className="text-lg font-extrabold">
        Background
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        {art.hasTransparency
          ? 'This art has transparency, so its outline follows it. You can still remove a colour.'
          : 'This art has no transparency. Sheetsmith removes the flat background around it; check the result.'}
      </p>
      <div className={`grid gap-4 ${showRemoval ? 'md:grid-cols-3' : 'md:grid-cols-2'}`}>
        <figure>
          <figcaption className="mb-1 text-sm font-bold">Before {canEdit && '(click to pick the colour to remove)'}</figcaption>
          <img
            src={art.fileUrl}
            alt={`${art.name}, as uploaded`}
            onClick={canEdit ? pick : undefined}
            className={`max-h-72 w-full rounded-lg bg-[repeating-conic-gradient(#f6ead8_0_25%,#fff_0_50%)] bg-[length:16px_16px] object-contain ${canEdit ? 'cursor-crosshair' : ''}`}
          />
        </figure>
        {showRemoval && (
          <figure>
            <figcaption className="mb-1 text-sm font-bold">What is removed</figcaption>
            <img
              src={removalPreviewUrl(teamId, art.id, { background, backgroundTolerance: debounced.tolerance })}
              alt={`${art.name} with the removed background tinted blue-grey and any art it takes in magenta`}
              data-testid="removal-preview"
              className="max-h-72 w-full rounded-lg object-contain"
            />
            <p className="mt-1 text-xs text-ink-soft">
              <span className="mr-1 inline-block h-3 w-3 rounded-sm bg-[#78a0c8] align-middle" aria-hidden="true" />
              background removed
              <span className="ml-3 mr-1 inline-block h-3 w-3 rounded-sm bg-[#c80078] align-middle" aria-hidden="true" />
              art taken with it
            </p>
          </figure>
        )}
        <figure>
          <figcaption className="mb-1 text-sm font-bold">
            After: the sticker with a 1/8 in border {preview.isFetching && '· updating…'}
          </figcaption>
          {preview.data?.pieces[0] ? (
            <img
              src={preview.data.pieces[0].pngUrl}
              alt={`${art.name} as a sticker`}
              data-testid="after-preview"
              className="max-h-72 w-full rounded-lg bg-[#9aa8a8] object-contain p-2"
            />
          ) : (
            <div className="flex h-72 items-center justify-center rounded-lg bg-paper text-sm">{preview.isError ? '' : 'Working…'}</div>
          )}
          {preview.isError && <FormMessage>{preview.error.message}</FormMessage>}
        </figure>
      </div>
      {cautions.length > 0 && (
        <ul data-testid="outline-cautions" className="mt-3 flex flex-col gap-1 text-sm">
          {cautions.map((w) => (
            <li key={`${w.code}-${w.message}`} className="rounded-lg bg-alarm-light px-3 py-1 font-semibold text-alarm">
              {w.message}
            </li>
          ))}
        </ul>
      )}
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
              <input
                type="range"
                min={0}
                max={120}
                value={tolerance}
                onChange={(e) => setTolerance(Number(e.target.value))}
                aria-valuetext={`${tolerance}`}
              />
              <span className="w-8 tabular-nums" data-testid="tolerance-value">
                {tolerance}
              </span>
              <button
                type="button"
                className="text-xs underline"
                onClick={() => setTolerance(mode === 'colour' ? DEFAULT_TOLERANCE.colour : DEFAULT_TOLERANCE.auto)}
              >
                Default ({mode === 'colour' ? DEFAULT_TOLERANCE.colour : DEFAULT_TOLERANCE.auto})
              </button>
            </label>
          )}
          <label className="flex items-center gap-2 font-bold">
            <input type="checkbox" checked={widenNecks} onChange={(e) => setWidenNecks(e.target.checked)} />
            Widen narrow parts of the cut line to the bridge width
          </label>
          <button
            type="button"
            className="rounded-full bg-ink px-4 py-1 font-bold text-paper"
            onClick={() => save.mutate({ background: { mode, colour: mode === 'colour' ? colour : null, tolerance }, widenNecks })}
          >
            Use for this art
          </button>
          {save.isSuccess && (
            <span role="status" className="text-sage-deep">
              Saved: sheets use this setting.
            </span>
          )}
          {save.isError && <FormMessage>{save.error.message}</FormMessage>}
        </div>
      )}
    </section>
  );
}
