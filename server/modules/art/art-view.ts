import { MM_PER_INCH } from '@shared/units';
import type { EntityManager } from 'typeorm';
import { In } from 'typeorm';
import type { ArtView, LicenceView } from '@shared/schemas/library';
import { User } from '../accounts/user.entity';
import { Collection } from '../collections/collection.entity';
import { licenceView } from '../collections/licence.columns';
import { ArtItem } from './art-item.entity';
import { keywordsOf } from './terms';
import { collectionsOf } from './memberships';

/** API views of art items, with keywords, collection, effective licence and uploader in few queries. */
export async function artViews(manager: EntityManager, items: ArtItem[]): Promise<ArtView[]> {
  if (items.length === 0) return [];
  const keywords = await keywordsOf(
    manager,
    items.map((i) => i.id),
  );
  const memberships = await collectionsOf(
    manager,
    items.map((i) => i.id),
  );
  const packIds = [...new Set(items.map((i) => i.packId).filter((id): id is string => id !== null))];
  const packs = new Map((packIds.length ? await manager.findBy(Collection, { id: In(packIds) }) : []).map((c) => [c.id, c]));
  const users = new Map((await manager.findBy(User, { id: In([...new Set(items.map((i) => i.uploadedBy))]) })).map((u) => [u.id, u]));
  return items.map((item) => {
    const base = `/api/teams/${item.teamId}/art/${item.id}`;
    const pack = item.packId ? (packs.get(item.packId) ?? null) : null;
    let licence: LicenceView | null = null;
    const source = licenceSource(item, pack);
    if (source === 'own') licence = { ...licenceView(item.licence, `${base}/licence-proof`)!, inheritedFrom: null };
    else if (source === 'pack' && pack)
      licence = {
        ...licenceView(pack.licence, `/api/teams/${item.teamId}/collections/${pack.id}/licence-proof`)!,
        inheritedFrom: { collectionId: pack.id, name: pack.name },
      };
    const at = (dpi: number) => ({ widthMm: (item.widthPx / dpi) * MM_PER_INCH, heightMm: (item.heightPx / dpi) * MM_PER_INCH });
    return {
      id: item.id,
      name: item.name,
      format: item.format,
      sizeBytes: item.sizeBytes,
      widthPx: item.widthPx,
      heightPx: item.heightPx,
      hasTransparency: item.hasTransparency,
      largestPrint: { at300: at(300), at150: at(150) },
      keywords: keywords.get(item.id) ?? [],
      collections: (memberships.get(item.id) ?? []).map((c) => ({ id: c.id, name: c.name })),
      licence,
      background: { mode: item.backgroundMode, colour: item.backgroundColour, tolerance: item.backgroundTolerance },
      widenNecks: item.widenNecks,
      uploadedBy: { id: item.uploadedBy, name: users.get(item.uploadedBy)?.name ?? 'Former member' },
      createdAt: item.createdAt.toISOString(),
      updatedAt: item.updatedAt.toISOString(),
      thumbnailUrl: `${base}/thumbnail`,
      fileUrl: `${base}/file`,
      source: item.sourceFormat ? { format: item.sourceFormat, url: `${base}/source` } : null,
    };
  });
}

/** Each art item's effective licence kind: its own, else its pack's, else null. */
/**
 * Which licence holds for an art item: its own when it has one, else that of the pack it came in
 * (the collection it was uploaded with). The one rule, for the art's page and the sheet checks.
 */
function licenceSource(item: Pick<ArtItem, 'licence'>, pack: Pick<Collection, 'licence'> | null): 'own' | 'pack' | null {
  if (item.licence.kind) return 'own';
  return pack?.licence.kind ? 'pack' : null;
}

/** The licence kind that holds for each of a team's art items (see licenceSource). */
export async function effectiveLicenceKinds(manager: EntityManager, teamId: string, ids: string[]): Promise<Map<string, string | null>> {
  if (ids.length === 0) return new Map();
  const items = await manager.findBy(ArtItem, { teamId, id: In(ids) });
  const packIds = [...new Set(items.map((i) => i.packId).filter((id): id is string => id !== null))];
  const packs = new Map((packIds.length ? await manager.findBy(Collection, { id: In(packIds) }) : []).map((c) => [c.id, c]));
  return new Map(
    items.map((item) => {
      const pack = item.packId ? (packs.get(item.packId) ?? null) : null;
      const source = licenceSource(item, pack);
      return [item.id, source === 'own' ? item.licence.kind : source === 'pack' ? pack!.licence.kind : null];
    }),
  );
}
