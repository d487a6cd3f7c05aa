import sharp from 'sharp';
import type { Box } from '../../../shared/geometry/polygon';
import { area, boundingBox, perimeter, ringToSvgPath, scale, translate } from '../../../shared/geometry/polygon';
import type { OutlineData, OutlineOptions, OutlineOptionsInput, OutlinePieceData, OutlineWarning } from '../../../shared/schemas/outline';
import { outlineOptionsSchema } from '../../../shared/schemas/outline';
import { MM_PER_INCH, formatLength } from '../../../shared/units';
import type { RemovalPlan } from './background';
import { detectBackground, parseHex, removeBackground } from './background';
import { bridgeIslands } from './bridge';
import { clearComponents, fillHoles, labelComponents, labelRuns } from './components';
import type { Component } from './components';
import { decodeArt } from './decode';
import { distanceTransform, squaredDistanceTransform } from '../../../shared/geometry/distance-transform';
import { OutlineInputError } from './errors';
import { erode, findNarrowParts, findNecks, findSlots, thinResidue } from './necks';
import { composeSticker, encodePng } from './raster';
import type { Frame } from './raster';
import { simplifyRing, traceOuterRings } from './trace';

export type OutlineLimits = { maxInputPixels: number; maxOutputPixels: number };
export const DEFAULT_LIMITS: OutlineLimits = { maxInputPixels: 50_000_000, maxOutputPixels: 40_000_000 };

/** One finished sticker with its PNG (see OutlinePieceData for the frame and the cut line). */
export type OutlinePiece = OutlinePieceData & { png: Buffer };
export type OutlineResult = OutlineData<OutlinePiece>;

const PAD = 2;

/** True when (nearly) every pixel is within tolerance of the colour. */
function isFlat(rgba: Buffer, colour: { r: number; g: number; b: number }, tolerance: number): boolean {
  let near = 0;
  const total = rgba.length / 4;
  for (let i = 0; i < rgba.length; i += 4) {
    if (Math.hypot(rgba[i] - colour.r, rgba[i + 1] - colour.g, rgba[i + 2] - colour.b) <= tolerance) near++;
  }
  return near >= 0.99 * total;
} // working margin (px) so traced rings never touch the canvas edge

function unionBox(components: Component[]): Box {
  const minX = Math.min(...components.map((c) => c.minX)),
    minY = Math.min(...components.map((c) => c.minY));
  const maxX = Math.max(...components.map((c) => c.maxX)),
    maxY = Math.max(...components.map((c) => c.maxY));
  return { x: minX, y: minY, width: maxX - minX + 1, height: maxY - minY + 1 };
}

/** Keeps components of at least `minArea` px (always the largest); returns kept and dropped. */
function splitSpecks(components: Component[], minArea: number) {
  const largest = components.reduce((a, b) => (b.area > a.area ? b : a));
  const kept = components.filter((c) => c === largest || c.area >= minArea);
  const keptLabels = new Set(kept.map((c) => c.label));
  const droppedLabels = new Set(components.filter((c) => !keptLabels.has(c.label)).map((c) => c.label));
  return { kept, dropped: droppedLabels.size, droppedLabels };
}

export async function outline(
  image: Buffer,
  rawOptions: OutlineOptionsInput,
  limits: OutlineLimits = DEFAULT_LIMITS,
): Promise<OutlineResult> {
  const options: OutlineOptions = outlineOptionsSchema.parse(rawOptions);
  const warnings: OutlineWarning[] = [];
  const decoded = await decodeArt(image, limits.maxInputPixels);
  const { rgba, width: W, height: H } = decoded;

  // 1. Background: transparency if the art has it, else a flat colour flooded in from the edges.
  const explicit = typeof options.background === 'object' ? options.background : null;
  let removal: { plan: RemovalPlan; tolerance: number } | null = null;
  if (explicit) {
    const plan = removeBackground(rgba, W, H, parseHex(explicit.colour), explicit.tolerance);
    removal = { plan, tolerance: explicit.tolerance };
    if (plan.removed > 0)
      warnings.push({ code: 'background-removed', severity: 'notice', message: `Removed the ${explicit.colour} background.` });
  } else if (options.background === 'auto' && !decoded.hasTransparency) {
    const colour = detectBackground(rgba, W, H, options.backgroundTolerance);
    // An image that is one flat colour edge to edge is all art, not all background.
    const flat = colour !== null && isFlat(rgba, colour, options.backgroundTolerance);
    if (colour && !flat) {
      removal = { plan: removeBackground(rgba, W, H, colour, options.backgroundTolerance), tolerance: options.backgroundTolerance };
      const hex = `#${[colour.r, colour.g, colour.b].map((v) => v.toString(16).padStart(2, '0')).join('')}`;
      warnings.push({
        code: 'background-removed',
        severity: 'notice',
        message: `No transparency: removed the flat ${hex} background around the art.`,
      });
    } else {
      warnings.push({
        code: 'no-flat-background',
        severity: 'notice',
        message: 'No transparency and no flat background colour: the whole image is used as the art.',
      });
    }
  }
  if (removal && removal.plan.share > options.removalGuard) {
    const percent = (removal.plan.share * 100).toFixed(removal.plan.share < 0.1 ? 1 : 0);
    warnings.push({
      code: 'background-took-art',
      severity: 'warning',
      message: `Background removal at tolerance ${removal.tolerance} also took away ${percent} % of the art (parts that differ from the background, inside the art). Lower the tolerance, or pick the colour to remove, and check the preview.`,
    });
  }

  // 2. Threshold and trim at source resolution, dropping specks (their size judged at print size).
  const threshold = options.alphaThreshold;
  const sourceMask = new Uint8Array(W * H);
  for (let i = 0; i < sourceMask.length; i++) sourceMask[i] = rgba[i * 4 + 3] >= threshold ? 1 : 0;
  const source = labelRuns(sourceMask, W, H);
  if (source.components.length === 0) {
    throw new OutlineInputError(
      'no-visible-art',
      'The image has no visible art: every pixel is transparent (or below the alpha threshold).',
    );
  }
  const pxPerMm = options.dpi / MM_PER_INCH;
  const sizeOf = (box: Box) =>
    options.width !== undefined
      ? { w: options.width, h: (options.width * box.height) / box.width }
      : { w: (options.height! * box.width) / box.height, h: options.height! };
  const provisional = unionBox(source.components);
  const targetPerSource = (sizeOf(provisional).w * pxPerMm) / provisional.width;
  const speckSourcePx = (options.minSpeckArea * pxPerMm * pxPerMm) / (targetPerSource * targetPerSource);
  const specks = splitSpecks(source.components, speckSourcePx);
  let droppedSpecks = specks.dropped;
  clearComponents(source.runs, specks.droppedLabels, (x0, x1, y) => rgba.fill(0, (y * W + x0) * 4, (y * W + x1) * 4)); // drop specks (RGBA to 0)
  const visible = unionBox(specks.kept);
  const printed = sizeOf(visible);
  const effectiveDpi = visible.width / (printed.w / MM_PER_INCH);

  // 3. Resample the visible part to the print resolution.
  const artW = Math.max(1, Math.round(printed.w * pxPerMm)),
    artH = Math.max(1, Math.round(printed.h * pxPerMm));
  const finishedW = Math.round((printed.w + 2 * options.border) * pxPerMm),
    finishedH = Math.round((printed.h + 2 * options.border) * pxPerMm);
  if (finishedW * finishedH > limits.maxOutputPixels) {
    throw new OutlineInputError(
      'too-large-output',
      `At ${options.dpi} DPI this sticker needs ${finishedW} × ${finishedH} px; the limit is ${(limits.maxOutputPixels / 1e6).toFixed(0)} megapixels. Choose a smaller size or DPI.`,
    );
  }
  const art = await sharp(rgba, { raw: { width: W, height: H, channels: 4 } })
    .extract({ left: visible.x, top: visible.y, width: visible.width, height: visible.height })
    .resize(artW, artH, { fit: 'fill', kernel: 'lanczos3' })
    .raw()
    .toBuffer();

  // 4. The art mask on a canvas padded by the border (art touching the image edge keeps its border).
  const cw = finishedW + 2 * PAD,
    ch = finishedH + 2 * PAD;
  const origin = { x: PAD + Math.round((finishedW - artW) / 2), y: PAD + Math.round((finishedH - artH) / 2) };
  const artMask = new Uint8Array(cw * ch);
  for (let y = 0; y < artH; y++) {
    for (let x = 0; x < artW; x++) {
      if (art[(y * artW + x) * 4 + 3] >= threshold) artMask[(y + origin.y) * cw + x + origin.x] = 1;
    }
  }
  const resampled = labelRuns(artMask, cw, ch);
  if (resampled.components.length === 0) {
    throw new OutlineInputError('no-visible-art', 'At this size the art vanishes: choose a larger printed size.');
  }
  const small = splitSpecks(resampled.components, options.minSpeckArea * pxPerMm * pxPerMm);
  clearComponents(resampled.runs, small.droppedLabels, (x0, x1, y) => artMask.fill(0, y * cw + x0, y * cw + x1));
  droppedSpecks += small.dropped;
  if (droppedSpecks > 0) {
    warnings.push({
      code: 'specks-dropped',
      severity: 'notice',
      message: `Dropped ${droppedSpecks} speck${droppedSpecks === 1 ? '' : 's'} smaller than ${options.minSpeckArea} mm².`,
    });
  }

  // 5. Grow by the border with an exact Euclidean distance transform; group islands by their grown regions.
  const level = options.border * pxPerMm + 0.5; // distances run between pixel centres
  const level2 = level * level;
  let squared = squaredDistanceTransform(artMask, cw, ch);
  const grown = new Uint8Array(cw * ch);
  for (let i = 0; i < grown.length; i++) grown[i] = squared[i] <= level2 ? 1 : 0;
  const groups = labelComponents(grown, cw, ch);

  const pieces: OutlinePiece[] = [];
  const minFeaturePx = options.minFeature * pxPerMm;
  const border = parseHex(options.borderColour);
  const toMm = (v: number) => v / pxPerMm;
  // Far from the cut line only the sign of the field matters; the square root is taken near it.
  const near2Low = level > 2 ? (level - 2) ** 2 : -1,
    near2High = (level + 2) ** 2;

  const buildPiece = async (pieceArt: Uint8Array, artVisible: (i: number) => boolean) => {
    const sq = pieceArt === artMask ? squared : squaredDistanceTransform(pieceArt, cw, ch);
    const field = new Float32Array(cw * ch);
    const inside = new Uint8Array(cw * ch);
    for (let i = 0; i < field.length; i++) {
      const d2 = sq[i];
      const f = d2 <= near2Low ? 2 : d2 >= near2High ? -2 : level - Math.sqrt(d2);
      field[i] = f;
      inside[i] = f >= 0 ? 1 : 0;
    }
    const filled = fillHoles(inside, cw, ch);
    const holes = new Uint8Array(cw * ch);
    for (let i = 0; i < holes.length; i++) {
      if (filled[i] && !inside[i]) {
        holes[i] = 1;
        // Filling the holes in the field too keeps them out of the traced rings.
        field[i] = 0.5;
      }
    }

    const rings = traceOuterRings(field, cw, ch);
    const ring = simplifyRing(rings[0], options.smoothing * pxPerMm);
    const box = boundingBox(ring);
    // The frame: the finished sticker's box in canvas pixels (the whole canvas for a joined piece).
    const frame: Frame =
      options.islands === 'join'
        ? { x: PAD, y: PAD, width: finishedW, height: finishedH }
        : (() => {
            const x0 = Math.max(0, Math.floor(box.x)),
              y0 = Math.max(0, Math.floor(box.y));
            return {
              x: x0,
              y: y0,
              width: Math.min(cw, Math.ceil(box.x + box.width)) - x0,
              height: Math.min(ch, Math.ceil(box.y + box.height)) - y0,
            };
          })();
    const points = scale(translate(ring, -frame.x, -frame.y), 1 / pxPerMm);

    // Three ways a blade tears a sticker: a waist narrower than the smallest feature (an inward offset
    // by half of it splits the shape), a thin spike (an opening by a disk that wide removes it; with a
    // border at least half the smallest feature the shape is a union of such disks and has none),
    // and a slot too narrow to cut (the same opening of the outside).
    const where = (p: { x: number; y: number }) => ({ xMm: toMm(p.x - frame.x), yMm: toMm(p.y - frame.y) });
    const at = (p: { xMm: number; yMm: number }) => `(${formatLength(p.xMm, 'mm')}, ${formatLength(p.yMm, 'mm')})`;
    const waists = findNecks(filled, cw, ch, minFeaturePx);
    const slack = minFeaturePx;
    // A thin part that holds a waist is that waist: one warning for one place.
    const spikes =
      level >= minFeaturePx / 2
        ? []
        : findNarrowParts(filled, cw, ch, minFeaturePx).filter(
            (t) =>
              !waists.some(
                (w) =>
                  w.x >= t.box.minX - slack && w.x <= t.box.maxX + 1 + slack && w.y >= t.box.minY - slack && w.y <= t.box.maxY + 1 + slack,
              ),
          );
    const necks = [...waists, ...spikes];
    for (const neck of necks) {
      const p = where(neck);
      warnings.push({
        code: 'narrow-neck',
        severity: 'warning',
        at: p,
        message: `The cut line narrows below ${formatLength(options.minFeature, 'mm')} near ${at(p)} from the sticker's top-left corner: the blade may tear it. Widen the border, or let Sheetsmith widen narrow necks.`,
      });
    }
    for (const slot of findSlots(filled, cw, ch, minFeaturePx)) {
      const p = where(slot);
      warnings.push({
        code: 'narrow-slot',
        severity: 'warning',
        at: p,
        message: `The cut line has a slot narrower than ${formatLength(options.minFeature, 'mm')} near ${at(p)} from the sticker's top-left corner: the blade cannot cut it cleanly. Widen the border to close it.`,
      });
    }
    const rgbaOut = composeSticker({
      frame,
      canvasWidth: cw,
      field,
      holes,
      art,
      artWidth: artW,
      artHeight: artH,
      artOrigin: origin,
      artVisible,
      border,
    });
    pieces.push({
      cutLine: { points, svgPath: ringToSvgPath(points) },
      areaMm2: area(points),
      perimeterMm: perimeter(points),
      bbox: boundingBox(points),
      widthMm: toMm(frame.width),
      heightMm: toMm(frame.height),
      offsetMm: { x: toMm(frame.x - PAD), y: toMm(frame.y - PAD) },
      png: await encodePng(rgbaOut, frame.width, frame.height, options.dpi),
      pixelWidth: frame.width,
      pixelHeight: frame.height,
    });
  };

  if (options.islands === 'join' || groups.components.length === 1) {
    // Parts are what the grown shape holds together more widely than the bridge width: an inward
    // offset by half of it keeps them apart where only a thin waist of border joins them. Parts of
    // one piece of art stay one part unless the maker asked to widen necks.
    const bridgePx = Math.max(options.bridgeWidth, options.minFeature) * pxPerMm;
    const wide = formatLength(Math.max(options.bridgeWidth, options.minFeature), 'mm');
    if (options.widenNecks) {
      // The maker agreed to change the shape: each narrow place the checks below would warn about
      // (a waist or a thin part under the smallest feature) gets art added around the part of the
      // cut shape thinner than the bridge width that holds it (what an opening by it removes),
      // until it is that wide; a closing then rounds the crevices where the widened part meets the rest.
      const filledGrown = fillHoles(grown, cw, ch);
      const narrow = [
        ...findNecks(filledGrown, cw, ch, minFeaturePx),
        ...(level >= minFeaturePx / 2 ? [] : findNarrowParts(filledGrown, cw, ch, minFeaturePx)),
      ];
      const residue = narrow.length ? thinResidue(grown, cw, ch, bridgePx / 2) : null;
      const pieces = residue ? labelComponents(residue, cw, ch) : null;
      const slack = Math.ceil(minFeaturePx) + 1;
      const holding = new Set<number>();
      for (const n of pieces ? narrow : []) {
        // The residue component at (or within the smallest feature of) the narrow place.
        for (let dy = -slack; dy <= slack; dy++) {
          for (let dx = -slack; dx <= slack; dx++) {
            const x = Math.floor(n.x) + dx,
              y = Math.floor(n.y) + dy;
            if (x >= 0 && y >= 0 && x < cw && y < ch && pieces!.labels[y * cw + x] > 0 && residue![y * cw + x])
              holding.add(pieces!.labels[y * cw + x]);
          }
        }
      }
      const thin = holding.size;
      if (residue && thin > 0) {
        const target = new Uint8Array(cw * ch);
        for (let i = 0; i < target.length; i++) if (residue[i] && holding.has(pieces!.labels[i])) target[i] = 1;
        const reach = distanceTransform(target, cw, ch);
        const grow = Math.max(1, bridgePx / 2 - (level - 0.5) + 1);
        for (let i = 0; i < artMask.length; i++) if (reach[i] <= grow) artMask[i] = 1;
        // Closing by a disc of the smallest feature, only around what was added: no new slots.
        const rc = Math.max(1, minFeaturePx);
        const toArt = distanceTransform(artMask, cw, ch);
        const dilated = new Uint8Array(cw * ch);
        for (let i = 0; i < dilated.length; i++) dilated[i] = toArt[i] <= rc ? 0 : 1; // the outside of the dilation
        const toOutside = distanceTransform(dilated, cw, ch);
        for (let i = 0; i < artMask.length; i++) if (!artMask[i] && toOutside[i] > rc && reach[i] <= grow + 2 * rc) artMask[i] = 1;
        squared = squaredDistanceTransform(artMask, cw, ch);
        for (let i = 0; i < grown.length; i++) grown[i] = squared[i] <= level2 ? 1 : 0;
        warnings.push({
          code: 'necks-widened',
          severity: 'notice',
          message: `Widened ${thin} narrow part${thin === 1 ? '' : 's'} of the cut line to at least ${wide}, as asked.`,
        });
      }
    }
    const parts = joinParts(artMask, grown, cw, ch, bridgePx / 2);
    if (parts.count > 1) {
      // The capsule drawn into the art grows by the border, so it needs only what the border lacks.
      const radius = Math.max(0.75, bridgePx / 2 - (level - 0.5) + 1);
      const bridges = bridgeIslands(artMask, parts.labels, parts.count, cw, ch, radius);
      squared = squaredDistanceTransform(artMask, cw, ch);
      warnings.push({
        code: 'islands-joined',
        severity: 'notice',
        message: `Joined ${parts.count} separate parts of the art into one sticker with ${bridges} bridge${bridges === 1 ? '' : 's'} at least ${wide} wide.`,
      });
    }
    await buildPiece(artMask, () => true);
  } else {
    for (const group of groups.components) {
      const pieceArt = new Uint8Array(cw * ch);
      for (let i = 0; i < artMask.length; i++) if (artMask[i] && groups.labels[i] === group.label) pieceArt[i] = 1;
      await buildPiece(pieceArt, (i) => groups.labels[i] === group.label);
    }
  }

  if (effectiveDpi < 150) {
    warnings.push({
      code: 'very-low-resolution',
      severity: 'warning',
      message: `The art has only ${Math.round(effectiveDpi)} DPI at this size (under 150 looks soft). Print it smaller or find a larger file.`,
    });
  } else if (effectiveDpi < 300) {
    warnings.push({
      code: 'low-resolution',
      severity: 'notice',
      message: `The art has ${Math.round(effectiveDpi)} DPI at this size (300 is ideal for stickers).`,
    });
  }

  return {
    pieces,
    art: {
      format: decoded.format,
      sourceWidthPx: W,
      sourceHeightPx: H,
      visible,
      printedWidthMm: printed.w,
      printedHeightMm: printed.h,
      hadTransparency: decoded.hasTransparency,
    },
    effectiveDpi,
    dpi: options.dpi,
    borderMm: options.border,
    warnings,
  };
}

/**
 * Labels art pixels by the part of the sticker they belong to (1..count): the components of the
 * grown shape eroded by `r` px, merged where one connected piece of art spans several (a piece of
 * art's own thin waist is the maker's drawing, warned about, not bridged unless asked).
 */
function joinParts(
  artMask: Uint8Array,
  grown: Uint8Array,
  width: number,
  height: number,
  r: number,
): { labels: Int32Array; count: number } {
  const eroded = erode(grown, width, height, r);
  const er = labelComponents(eroded, width, height);
  const art = labelComponents(artMask, width, height);
  const E = er.components.length;
  const parent = Int32Array.from({ length: E + art.components.length + 1 }, (_, i) => i);
  const find = (a: number): number => (parent[a] === a ? a : (parent[a] = find(parent[a])));
  const union = (a: number, b: number) => {
    const ra = find(a),
      rb = find(b);
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
  };
  for (let i = 0; i < artMask.length; i++) if (artMask[i] && er.labels[i] > 0) union(er.labels[i], E + art.labels[i]);
  const ids = new Map<number, number>();
  const labels = new Int32Array(artMask.length);
  for (let i = 0; i < artMask.length; i++) {
    if (!artMask[i]) continue;
    const root = find(E + art.labels[i]);
    if (!ids.has(root)) ids.set(root, ids.size + 1);
    labels[i] = ids.get(root)!;
  }
  return { labels, count: ids.size };
}
