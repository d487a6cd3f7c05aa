import type { Box } from '@shared/geometry/polygon';
import { area, boundingBox, perimeter, ringToSvgPath, scale, translate } from '@shared/geometry/polygon';
import type { OutlineData, OutlineOptions, OutlineOptionsInput, OutlinePieceData, OutlineWarning } from '@shared/schemas/outline';
import { outlineOptionsSchema } from '@shared/schemas/outline';
import { MM_PER_INCH, formatLength } from '@shared/units';
import { type RemovalPlan, detectBackground, parseHex, removeBackground } from './background';
import { bridgeIslands } from './bridge';
import { clearComponents, fillHoleRuns, labelRowRuns } from './components';
import { dilateRuns, maskOfRuns, placeRuns, runsOfAlpha, selectRuns } from './runs';
import { decodeArt } from './decode';
import { resampleArt } from './resample';
import { squaredDistanceTransform } from '@shared/geometry/distance-transform';
import { OutlineInputError } from './errors';
import { type Frame, borderField, composeSticker, encodePng } from './raster';
import { borrow, giveBack, Loans } from './scratch';
import { simplifyRing, traceOuterRings } from './trace';
import { isFlat, joinParts, splitSpecks, unionBox, widenNarrowParts } from './shape-steps';
import { tearWarnings } from './tear-warnings';

export type OutlineLimits = { maxInputPixels: number; maxOutputPixels: number };
export const DEFAULT_LIMITS: OutlineLimits = { maxInputPixels: 50_000_000, maxOutputPixels: 40_000_000 };

/** One finished sticker with its PNG (see OutlinePieceData for the frame and the cut line). */
export type OutlinePiece = OutlinePieceData & { png: Buffer };
export type OutlineResult = OutlineData<OutlinePiece>;

const PAD = 2;

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
  const source = labelRowRuns(runsOfAlpha(rgba, W, H, threshold));
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
  const art = await resampleArt(rgba, W, visible, artW, artH);

  // 4. The art mask on a canvas padded by the border (art touching the image edge keeps its border).
  const cw = finishedW + 2 * PAD,
    ch = finishedH + 2 * PAD;
  const origin = { x: PAD + Math.round((finishedW - artW) / 2), y: PAD + Math.round((finishedH - artH) / 2) };
  const placedArt = placeRuns(runsOfAlpha(art, artW, artH, threshold), origin.x, origin.y, cw, ch);
  const resampled = labelRowRuns(placedArt);
  if (resampled.components.length === 0) {
    throw new OutlineInputError('no-visible-art', 'At this size the art vanishes: choose a larger printed size.');
  }
  const small = splitSpecks(resampled.components, options.minSpeckArea * pxPerMm * pxPerMm);
  const artRuns = selectRuns(placedArt, (k) => !small.droppedLabels.has(resampled.runs.label[k]));
  // The canvas-sized buffers come from the scratch pool and go back when the stickers are made.
  const loans = new Loans();
  const artMask = maskOfRuns(artRuns, new Uint8Array(loans.take(cw * ch), 0, cw * ch));
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
  // Squared distances to art, exact up to 2 px past the cut line: all the field needs (farther only
  // the sign counts), and all the grown shape needs (within `level`).
  const distancesTo = (mask: Uint8Array, out?: Float32Array) => squaredDistanceTransform(mask, cw, ch, out, level + 2);
  const squared = distancesTo(artMask, new Float32Array(loans.take(4 * cw * ch), 0, cw * ch));
  // Within `level` of the art (the art's runs grown by a disk: cheap to label). Art in one piece grows
  // into one region: it is needed only for several pieces of art or for widening.
  const grownRuns = small.kept.length > 1 || options.widenNecks ? dilateRuns(artRuns, level, true) : null;
  const groups = grownRuns && options.islands === 'split' ? labelRowRuns(grownRuns) : null;

  const pieces: OutlinePiece[] = [];
  const minFeaturePx = options.minFeature * pxPerMm;
  const border = parseHex(options.borderColour);
  const toMm = (v: number) => v / pxPerMm;

  const buildPiece = async (pieceArt: Uint8Array, artVisible: ((i: number) => boolean) | null) => {
    // The field is written over the squared distances (this piece is their last reader).
    const field = pieceArt === artMask ? squared : distancesTo(pieceArt);
    const inside = borderField(field, cw, ch, level);
    // Holes inside the cut line are filled, in the field too: they stay out of the traced rings and
    // print in the border colour (coverage min(1, field + 0.5) is 1 there).
    const { filled, holes } = fillHoleRuns(inside);
    for (let y = 0; y < ch; y++)
      for (let k = holes.rowStart[y]; k < holes.rowStart[y + 1]; k++) field.fill(0.5, y * cw + holes.starts[k], y * cw + holes.ends[k]);

    const rings = traceOuterRings(field, cw, ch, filled);
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

    const outBuffer = borrow(frame.width * frame.height * 4);
    const rgbaOut = composeSticker({
      into: Buffer.from(outBuffer, 0, frame.width * frame.height * 4),
      frame,
      canvasWidth: cw,
      field,
      art,
      artWidth: artW,
      artHeight: artH,
      artOrigin: origin,
      artVisible,
      border,
    });
    // sharp encodes on its own thread while this one checks the cut line for tears.
    const png = encodePng(rgbaOut, frame.width, frame.height, options.dpi).finally(() => giveBack(outBuffer));
    warnings.push(...tearWarnings(filled, { minFeaturePx, level, minFeatureMm: options.minFeature, toMm, frame }));
    pieces.push({
      cutLine: { points, svgPath: ringToSvgPath(points) },
      areaMm2: area(points),
      perimeterMm: perimeter(points),
      bbox: boundingBox(points),
      widthMm: toMm(frame.width),
      heightMm: toMm(frame.height),
      offsetMm: { x: toMm(frame.x - PAD), y: toMm(frame.y - PAD) },
      png: await png,
      pixelWidth: frame.width,
      pixelHeight: frame.height,
    });
  };

  try {
    if (!groups || groups.components.length === 1) {
      // Parts are what the grown shape holds together more widely than the bridge width: an inward
      // offset by half of it keeps them apart where only a thin waist of border joins them. Parts of
      // one piece of art stay one part unless the maker asked to widen necks.
      const bridgePx = Math.max(options.bridgeWidth, options.minFeature) * pxPerMm;
      const wide = formatLength(Math.max(options.bridgeWidth, options.minFeature), 'mm');
      // The grown shape as pixels, only for the steps that change the art.
      const grown = grownRuns ? maskOfRuns(grownRuns) : new Uint8Array(0);
      if (options.widenNecks) {
        // The maker agreed to change the shape: each narrow place the checks below would warn about
        // (a waist or a thin part under the smallest feature) gets art added around the part of the
        // cut shape thinner than the bridge width that holds it (what an opening by it removes),
        // until it is that wide; a closing then rounds the crevices where the widened part meets the rest.
        const thin = widenNarrowParts(artMask, grown, cw, ch, { minFeaturePx, bridgePx, level });
        if (thin > 0) {
          distancesTo(artMask, squared); // the art changed: measured again in the same buffer
          for (let i = 0; i < grown.length; i++) grown[i] = squared[i] <= level2 ? 1 : 0;
          warnings.push({
            code: 'necks-widened',
            severity: 'notice',
            message: `Widened ${thin} narrow part${thin === 1 ? '' : 's'} of the cut line to at least ${wide}, as asked.`,
          });
        }
      }
      // One connected piece of art is one part whatever its waists (see joinParts): nothing to label.
      const parts = small.kept.length > 1 ? joinParts(artMask, grown, cw, ch, bridgePx / 2) : { count: 1, labels: null };
      if (parts.count > 1) {
        // The capsule drawn into the art grows by the border, so it needs only what the border lacks.
        const radius = Math.max(0.75, bridgePx / 2 - (level - 0.5) + 1);
        const bridges = bridgeIslands(artMask, parts.labels!, parts.count, cw, ch, radius);
        distancesTo(artMask, squared);
        warnings.push({
          code: 'islands-joined',
          severity: 'notice',
          message: `Joined ${parts.count} separate parts of the art into one sticker with ${bridges} bridge${bridges === 1 ? '' : 's'} at least ${wide} wide.`,
        });
      }
      await buildPiece(artMask, null);
    } else {
      const groupLabels = new Int32Array(cw * ch);
      const { runs } = groups;
      for (let k = 0; k < runs.count; k++) groupLabels.fill(runs.label[k], runs.y[k] * cw + runs.x0[k], runs.y[k] * cw + runs.x1[k] + 1);
      for (const group of groups.components) {
        const pieceArt = new Uint8Array(cw * ch);
        for (let i = 0; i < artMask.length; i++) if (artMask[i] && groupLabels[i] === group.label) pieceArt[i] = 1;
        await buildPiece(pieceArt, (i) => groupLabels[i] === group.label);
      }
    }
  } finally {
    loans.returnAll();
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
