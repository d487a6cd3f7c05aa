// What background removal takes, for the art page: the original with the removed background tinted
// and any art the removal would take in a warning colour, so the maker sees it before printing.
import sharp from 'sharp';
import type { OutlineOptions } from '@shared/schemas/outline';
import { detectBackground, parseHex, planRemoval } from './background';
import { decodeArt } from './decode';
import type { OutlineLimits } from './outline';

export type RemovalPreview = { png: Buffer; removedShare: number; takenShare: number };

/** Tints: removed background in a cool blue-grey, art that would be taken in a hot magenta few clip-art palettes use. */
const BACKGROUND_TINT = { r: 120, g: 160, b: 200, a: 0.7 };
const TAKEN_TINT = { r: 200, g: 0, b: 120, a: 0.85 };

/** The same removal the outline engine does for `options.background`, drawn at most `maxSide` px. */
export async function removalPreview(
  image: Buffer,
  options: Pick<OutlineOptions, 'background' | 'backgroundTolerance'>,
  limits: OutlineLimits,
  maxSide = 640,
): Promise<RemovalPreview> {
  const decoded = await decodeArt(image, limits.maxInputPixels);
  const { rgba, width: W, height: H } = decoded;
  const explicit = typeof options.background === 'object' ? options.background : null;
  const colour = explicit
    ? parseHex(explicit.colour)
    : options.background === 'auto' && !decoded.hasTransparency
      ? detectBackground(rgba, W, H, options.backgroundTolerance)
      : null;
  const tolerance = explicit ? explicit.tolerance : options.backgroundTolerance;
  const plan = colour ? planRemoval(rgba, W, H, colour, tolerance) : null;
  const out = Buffer.alloc(W * H * 4);
  for (let i = 0; i < W * H; i++) {
    const tint = plan?.map[i] === 1 ? BACKGROUND_TINT : plan?.map[i] === 2 ? TAKEN_TINT : null;
    const a = rgba[i * 4 + 3] / 255;
    // Flatten onto white first (transparent areas show as white), then lay the tint over it.
    let r = 255 + (rgba[i * 4] - 255) * a,
      g = 255 + (rgba[i * 4 + 1] - 255) * a,
      b = 255 + (rgba[i * 4 + 2] - 255) * a;
    if (tint) {
      r += (tint.r - r) * tint.a;
      g += (tint.g - g) * tint.a;
      b += (tint.b - b) * tint.a;
    }
    out[i * 4] = r;
    out[i * 4 + 1] = g;
    out[i * 4 + 2] = b;
    out[i * 4 + 3] = 255;
  }
  const scale = Math.min(1, maxSide / Math.max(W, H));
  const png = await sharp(out, { raw: { width: W, height: H, channels: 4 } })
    .resize(Math.max(1, Math.round(W * scale)), Math.max(1, Math.round(H * scale)), { kernel: 'nearest' })
    .png()
    .toBuffer();
  return { png, removedShare: plan ? plan.removed / (W * H) : 0, takenShare: plan?.share ?? 0 };
}
