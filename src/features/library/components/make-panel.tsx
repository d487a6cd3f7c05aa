import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router';
import type { CollectionView, UploadResult } from '@shared/schemas/library';
import { SHAPES, STICKER_FONTS } from '@shared/schemas/made-art';
import type { LengthUnit } from '@shared/units';
import { fromMm, parseLength } from '@shared/units';
import { Button, FormMessage } from '@/components/form';
import { useAction } from '@/hooks/use-action';
import { api } from '@/lib/api-client';
import { CollectionSelect } from './collection-select';

const input = 'rounded border-2 border-paper-edge px-2 py-1 font-normal';
const label = 'flex flex-col text-xs font-bold';
const FIELD_OF: Record<string, string> = { letterMm: 'letter', shapeWidthMm: 'width', shapeHeightMm: 'height' };

/**
 * Make a sticker from words (name labels, quotes) or a shape with optional words inside (planner
 * boxes, circles with a word): a live preview from the server, then it joins the library as art.
 */
export function MakePanel({
  teamId,
  unit,
  collections,
  onClose,
}: {
  teamId: string;
  unit: LengthUnit;
  collections: CollectionView[];
  onClose: () => void;
}) {
  const client = useQueryClient();
  const mm = (v: number) => String(+fromMm(v, unit).toFixed(unit === 'in' ? 3 : 1));
  // What the maker typed lives in react-hook-form; the server validates it (shared schema) and names a bad field.
  const rhf = useForm({
    defaultValues: {
      name: '',
      kind: 'text' as 'text' | 'shape',
      text: '',
      font: 'rounded',
      letter: mm(10),
      textColour: '#264653',
      align: 'centre',
      shape: 'rounded',
      width: mm(50),
      height: mm(25),
      fill: '#e9c46a',
      collectionId: '',
    },
  });
  const d = rhf.watch();
  // The preview follows the values, not the object watch() hands out anew on each render.
  const typed = JSON.stringify(d);
  const body = () => ({
    name: d.name || (d.kind === 'text' ? d.text.split('\n')[0].slice(0, 60) : SHAPES[d.shape as keyof typeof SHAPES]) || 'Made sticker',
    kind: d.kind,
    text: d.text,
    font: d.font,
    // Lengths typed in the user's unit; what cannot be read goes as typed and the server names the field.
    letterMm: parseLength(d.letter, unit) ?? d.letter,
    textColour: d.textColour,
    align: d.align,
    shape: d.shape,
    shapeWidthMm: parseLength(d.width, unit) ?? d.width,
    shapeHeightMm: parseLength(d.height, unit) ?? d.height,
    fill: d.fill,
    ...(d.collectionId && { collectionId: d.collectionId }),
  });
  const [preview, setPreview] = useState<string | null>(null);
  const [previewError, setPreviewError] = useState<string | null>(null);
  useEffect(() => {
    const handle = setTimeout(() => {
      if (d.kind === 'text' && !d.text.trim()) return setPreview(null);
      api<{ svg: string }>('POST', `/teams/${teamId}/art/made/preview`, body()).then(
        (r) => {
          setPreview(r.svg);
          setPreviewError(null);
        },
        (e: Error & { fields?: Record<string, string> }) => setPreviewError(Object.values(e.fields ?? {})[0] ?? e.message),
      );
    }, 300);
    return () => clearTimeout(handle);
  }, [typed]); // eslint-disable-line react-hooks/exhaustive-deps
  const { error, fields, busy, run } = useAction({ preferField: true });
  const [made, setMade] = useState<UploadResult | null>(null);
  const fieldError = (key: string) => Object.entries(fields).find(([k]) => (FIELD_OF[k] ?? k) === key)?.[1];
  const text = (key: keyof typeof d, title: string, w = 'w-20') => (
    <label className={label}>
      {title}
      <input
        value={String(d[key])}
        onChange={(e) => rhf.setValue(key, e.target.value)}
        aria-invalid={fieldError(key) ? true : undefined}
        className={`${input} ${w} ${fieldError(key) ? 'border-alarm' : ''}`}
      />
      {fieldError(key) && <span className="font-normal text-alarm">{fieldError(key)}</span>}
    </label>
  );
  const choose = (key: keyof typeof d, title: string, options: Record<string, string>) => (
    <label className={label}>
      {title}
      <select value={String(d[key])} onChange={(e) => rhf.setValue(key, e.target.value)} className={input}>
        {Object.entries(options).map(([value, name]) => (
          <option key={value} value={value}>
            {name}
          </option>
        ))}
      </select>
    </label>
  );
  const colour = (key: 'textColour' | 'fill', title: string) => (
    <label className={label}>
      {title}
      <input type="color" value={d[key]} onChange={(e) => rhf.setValue(key, e.target.value)} className="h-8 w-12" />
    </label>
  );
  const fonts = Object.fromEntries(Object.entries(STICKER_FONTS).map(([k, f]) => [k, `${f.label} (${f.family})`]));
  return (
    <section aria-labelledby="make-title" className="mb-6 rounded-sticker border-2 border-paper-edge bg-white p-5" data-testid="make-panel">
      <div className="mb-3 flex items-center justify-between">
        <h2 id="make-title" className="text-lg font-extrabold">
          Make a sticker from words or a shape
        </h2>
        <button type="button" className="font-bold underline" onClick={onClose}>
          Close
        </button>
      </div>
      <div className="grid gap-4 lg:grid-cols-[1fr_18rem]">
        <form
          className="flex flex-col gap-3"
          onSubmit={rhf.handleSubmit(
            () =>
              void run(async () => {
                const res = await api<{ results: UploadResult[] }>('POST', `/teams/${teamId}/art/made`, body());
                setMade(res.results[0]);
                await client.invalidateQueries({ queryKey: ['teams', teamId, 'art'] });
              }),
          )}
        >
          <div role="radiogroup" aria-label="Sticker of" className="flex gap-3 text-sm font-bold">
            {(['text', 'shape'] as const).map((k) => (
              <label key={k} className="flex items-center gap-1">
                <input type="radio" name="kind" checked={d.kind === k} onChange={() => rhf.setValue('kind', k)} />
                {k === 'text' ? 'Words' : 'Shape (words inside optional)'}
              </label>
            ))}
          </div>
          <label className={label}>
            Words (one line per line)
            <textarea
              value={d.text}
              rows={3}
              onChange={(e) => rhf.setValue('text', e.target.value)}
              aria-invalid={fieldError('text') ? true : undefined}
              className={`${input} w-full`}
            />
            {fieldError('text') && <span className="font-normal text-alarm">{fieldError('text')}</span>}
          </label>
          <div className="flex flex-wrap items-end gap-2">
            {choose('font', 'Font', fonts)}
            {text('letter', `Letter size (${unit})`)}
            {colour('textColour', 'Words')}
            {choose('align', 'Lines', { left: 'Left', centre: 'Centred', right: 'Right' })}
          </div>
          {d.kind === 'shape' && (
            <div className="flex flex-wrap items-end gap-2">
              {choose('shape', 'Shape', SHAPES)}
              {text('width', `Width (${unit})`)}
              {d.shape !== 'circle' && text('height', `Height (${unit})`)}
              {colour('fill', 'Fill')}
            </div>
          )}
          <div className="flex flex-wrap items-end gap-2">
            {text('name', 'Name in the library', 'w-56')}
            <label className={label}>
              Put into collection
              <CollectionSelect
                value={d.collectionId}
                onChange={(collectionId) => rhf.setValue('collectionId', collectionId)}
                collections={collections}
                className={input}
              />
            </label>
            <Button type="submit" busy={busy}>
              Add to the library
            </Button>
          </div>
          <p className="text-xs text-ink-faint">
            It gets a border and a cut line like any art when you place it on a sheet. Fonts: Nunito, Caveat and Lilita One, shipped with
            Sheetsmith under the SIL Open Font License.
          </p>
          {error && !Object.keys(fields).length && <FormMessage>{error}</FormMessage>}
          {made?.item && (
            <FormMessage tone="ok">
              Added “{made.item.name}”. <Link to={made.item.id}>Open it</Link> or place it from the editor’s art panel.
            </FormMessage>
          )}
        </form>
        <figure className="flex min-h-40 flex-col items-center justify-center rounded-lg bg-paper p-3" aria-label="Preview">
          {preview ? (
            <img
              src={`data:image/svg+xml;utf8,${encodeURIComponent(preview)}`}
              alt="Preview of the sticker art"
              className="max-h-56 max-w-full"
              data-testid="make-preview"
            />
          ) : (
            <p className="text-sm text-ink-faint">{previewError ?? 'Type the words to see the sticker.'}</p>
          )}
          {preview && previewError && <figcaption className="text-xs text-alarm">{previewError}</figcaption>}
        </figure>
      </div>
    </section>
  );
}
