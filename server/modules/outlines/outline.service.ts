import { createHash } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { OutlineOptions, OutlineData, OutlinePieceData } from '@shared/schemas/outline';
import type { RemovalPreviewQuery } from '@shared/schemas/outline';
import { DEFAULT_TOLERANCE, outlineOptionsSchema } from '@shared/schemas/outline';
import type { Piece } from '@shared/sheet/document';
import type { CutLimits } from '@shared/sheet/outline-request';
import { artBackgroundOptions, pieceOutlineOptions } from '@shared/sheet/outline-request';
import type { OutlinePool } from '../../engine/outline/pool';
import type { JobQueues, OutlineJobData } from '../../jobs/queues';
import { AppError, forbidden, notFound } from '../../lib/errors';
import type { Role } from '@shared/permissions';
import { can } from '@shared/permissions';
import type { Storage } from '../../storage/storage';
import { ArtItem } from '../art/art-item.entity';
import { OutlineCacheEntry } from './outline-cache.entity';

/** Bump when the engine's output changes, so old cache entries are not served. */
const OUTLINE_ENGINE_VERSION = 'outline-2';

export type StoredPiece = OutlinePieceData & { pngKey: string };
export type StoredOutline = OutlineData<StoredPiece>;

/** JSON with sorted keys, so equal options always hash the same. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => a.localeCompare(b));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonical(v)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

export function outlineCacheKey(artSha256: string, options: OutlineOptions): string {
  return createHash('sha256')
    .update(`${OUTLINE_ENGINE_VERSION}\n${artSha256}\n${canonical(options)}`)
    .digest('hex');
}

/** What the request leaves out, the art item's saved setting fills in: its background and whether narrow parts may be widened. */
export function withArtSetting(
  item: ArtItem,
  options: OutlineOptions,
  explicit: { background: boolean; widenNecks: boolean },
): OutlineOptions {
  if (explicit.background && explicit.widenNecks) return options;
  return outlineOptionsSchema.parse({
    ...options,
    ...(explicit.background ? {} : artBackgroundOptions(item)),
    ...(explicit.widenNecks ? {} : { widenNecks: item.widenNecks }),
  });
}

/**
 * Who may make new outlines: anyone who can edit sheets or add art. A viewer reads only outlines
 * already made, so a read-only role cannot make the server compute and store images at will.
 */
export type OutlineAccess = 'compute' | 'cached';
export const outlineAccess = (role: Role | undefined): OutlineAccess =>
  can(role, 'sheets.edit') || can(role, 'library.contribute') ? 'compute' : 'cached';
const outlineNotMade = () =>
  new AppError(409, 'outline_not_made', 'This outline has not been made yet: it is made when someone who can edit the sheet opens it.');

export class OutlineService {
  private readonly inFlight = new Map<string, Promise<{ entry: OutlineCacheEntry; cached: boolean }>>();

  constructor(
    private readonly dataSource: DataSource,
    private readonly storage: Storage,
    private readonly pool: OutlinePool,
    private readonly queues?: JobQueues,
  ) {}

  /** The outline the editor requests for a placed piece: the same options, so the same cache entry. */
  forPiece(art: ArtItem, piece: Pick<Piece, 'width' | 'border' | 'borderColour'>, limits: CutLimits, access: OutlineAccess = 'compute') {
    return this.forArt(art, outlineOptionsSchema.parse(pieceOutlineOptions(art, piece, limits)), access);
  }

  /** The outline of a team's art at the given options, from cache when it was computed before. */
  async forArt(
    art: ArtItem,
    options: OutlineOptions,
    access: OutlineAccess = 'compute',
  ): Promise<{ key: string; cached: boolean; outline: StoredOutline }> {
    const key = outlineCacheKey(art.sha256, options);
    const repo = this.dataSource.getRepository(OutlineCacheEntry);
    const hit = await repo.findOneBy({ cacheKey: key });
    if (hit) {
      await repo.update({ id: hit.id }, { lastUsedAt: new Date() });
      return { key, cached: true, outline: JSON.parse(hit.resultJson) };
    }
    if (access === 'cached') throw outlineNotMade();
    // Identical requests that arrive together share one computation.
    let job = this.inFlight.get(key);
    if (!job) {
      job = this.compute(key, art, options).finally(() => this.inFlight.delete(key));
      this.inFlight.set(key, job);
    }
    const { entry } = await job;
    return { key, cached: false, outline: JSON.parse(entry.resultJson) };
  }

  private async compute(key: string, art: ArtItem, options: OutlineOptions) {
    const data: OutlineJobData = { key, artSha256: art.sha256, storageKey: art.storageKey, options };
    // On the queue when there is one: any worker, on any machine, may make it.
    if (this.queues) await this.queues.runOutline(data);
    else await this.make(data);
    return { entry: await this.dataSource.getRepository(OutlineCacheEntry).findOneByOrFail({ cacheKey: key }), cached: false };
  }

  /** Makes one outline and stores it (PNGs in storage, the result in the cache table): the outline job. */
  async make({ key, artSha256, storageKey, options }: OutlineJobData): Promise<void> {
    const repo = this.dataSource.getRepository(OutlineCacheEntry);
    if (await repo.existsBy({ cacheKey: key })) return; // made meanwhile by another request
    const started = performance.now();
    const result = await this.pool.run(await this.storage.get(storageKey), options);
    const pieces: StoredPiece[] = [];
    for (const { png, ...piece } of result.pieces) pieces.push({ ...piece, pngKey: (await this.storage.put(png)).key });
    const stored: StoredOutline = { ...result, pieces };
    const entry = repo.create({
      cacheKey: key,
      artSha256,
      optionsJson: canonical(options),
      resultJson: JSON.stringify(stored),
      computeMs: Math.round(performance.now() - started),
      lastUsedAt: new Date(),
    });
    // Another process may have written the same key meanwhile: keep whichever landed first.
    await repo.createQueryBuilder().insert().into(OutlineCacheEntry).values(entry).orIgnore().execute();
  }

  /** The art's original with what removing `background` takes drawn over it (not cached: it is small and quick). */
  async removalPreview(art: ArtItem, query: RemovalPreviewQuery, access: OutlineAccess) {
    if (access === 'cached') throw forbidden('Only people who can edit sheets or add art preview background removal.');
    const tolerance = query.backgroundTolerance;
    const background =
      query.background === 'auto' || query.background === 'keep'
        ? query.background
        : { colour: query.background, tolerance: tolerance ?? DEFAULT_TOLERANCE.colour };
    return this.pool.removalPreview(await this.storage.get(art.storageKey), {
      width: 10,
      background,
      backgroundTolerance: tolerance ?? DEFAULT_TOLERANCE.auto,
    });
  }

  /** A piece's PNG, only if the team has art with the outline's content hash. */
  async piecePng(teamId: string, key: string, index: number): Promise<Buffer> {
    const entry = await this.dataSource.getRepository(OutlineCacheEntry).findOneBy({ cacheKey: key });
    const owned = entry && (await this.dataSource.getRepository(ArtItem).existsBy({ teamId, sha256: entry.artSha256 }));
    const piece = owned ? (JSON.parse(entry.resultJson) as StoredOutline).pieces[index] : undefined;
    if (!piece) throw notFound('That outline');
    return this.storage.get(piece.pngKey);
  }
}
