import type { DataSource } from 'typeorm';
import type { Storage } from './storage';
import { KEY_PATTERN } from './storage';

/**
 * Every column that holds a storage key. A new column that stores a key must be added here, or
 * the sweep would take its files: tests/api/storage-sweep.test.ts checks each kind of file.
 */
const KEY_COLUMNS: ReadonlyArray<[table: string, column: string]> = [
  ['art_items', 'storage_key'],
  ['art_items', 'thumbnail_key'],
  ['art_items', 'licence_proof_key'],
  ['art_items', 'source_key'],
  ['collections', 'licence_proof_key'],
  ['sheets', 'thumbnail_key'],
  ['sheet_exports', 'zip_key'],
  ['print_runs', 'photo_key'],
];
/** JSON columns that hold keys inside them: cached outlines' PNGs, and the pictures a proof was sent with. */
const JSON_KEYS: ReadonlyArray<[table: string, column: string, field: string]> = [
  ['outline_cache', 'result_json', 'pngKey'],
  ['order_proofs', 'snapshot_json', 'imageKey'],
];

/**
 * Every key a row refers to, keys inside JSON columns (outline PNGs, proof pictures) included. Raw SQL on
 * purpose here and below: the sweep reads key columns of tables from every module by name
 * (KEY_COLUMNS, fixed strings), below the modules, with no entity of its own.
 */
async function referencedKeys(dataSource: DataSource): Promise<Set<string>> {
  const keys = new Set<string>();
  for (const [table, column] of KEY_COLUMNS) {
    const rows: Array<{ k: string }> = await dataSource.query(`SELECT DISTINCT ${column} AS k FROM ${table} WHERE ${column} IS NOT NULL`);
    for (const row of rows) keys.add(row.k);
  }
  for (const [table, column, field] of JSON_KEYS) {
    const pattern = new RegExp(`"${field}":"([0-9a-f]{64})"`, 'g');
    let after = '0';
    for (;;) {
      const rows: Array<{ id: string; j: string }> = await dataSource.query(
        `SELECT id, ${column} AS j FROM ${table} WHERE id > ? ORDER BY id LIMIT 500`,
        [after],
      );
      if (rows.length === 0) break;
      for (const row of rows) for (const match of row.j.matchAll(pattern)) keys.add(match[1]);
      after = rows[rows.length - 1].id;
    }
  }
  return keys;
}

/** Whether any row refers to `key` (for deleting one replaced file at once). */
async function isReferenced(dataSource: DataSource, key: string): Promise<boolean> {
  for (const [table, column] of KEY_COLUMNS) {
    const [row] = await dataSource.query(`SELECT 1 AS x FROM ${table} WHERE ${column} = ? LIMIT 1`, [key]);
    if (row) return true;
  }
  for (const [table, column, field] of JSON_KEYS) {
    const [row] = await dataSource.query(`SELECT 1 AS x FROM ${table} WHERE ${column} LIKE ? LIMIT 1`, [`%"${field}":"${key}"%`]);
    if (row) return true;
  }
  return false;
}

/** A file written or re-put this recently may belong to a row not committed yet: only the sweep takes it, later. */
const RECENT_PUT_MS = 60_000;

/** Deletes a file a row just stopped referring to, unless another row still does (or may be about to). */
export async function releaseKey(dataSource: DataSource, storage: Storage, key: string | null | undefined): Promise<boolean> {
  if (!key || (await isReferenced(dataSource, key))) return false;
  const modifiedAt = await storage.modifiedAt(key);
  if (!modifiedAt || Date.now() - modifiedAt.getTime() < RECENT_PUT_MS) return false;
  await storage.delete(key);
  return true;
}

type SweepReport = { scanned: number; deleted: number; keptYoung: number; bytesFreed?: number };

/**
 * Removes stored files no row refers to, once they are older than the grace period (an upload in
 * progress writes its files before its rows). References are read after the listing, and each
 * file's age is read again just before it goes, so a file re-put meanwhile (its age renews) stays.
 */
export async function sweepStorage(dataSource: DataSource, storage: Storage, graceMs: number, now = Date.now()): Promise<SweepReport> {
  const candidates: string[] = [];
  const leftovers: string[] = [];
  let scanned = 0;
  let keptYoung = 0;
  for await (const { key, modifiedAt } of storage.list()) {
    scanned += 1;
    const old = now - modifiedAt.getTime() > graceMs;
    if (!old) keptYoung += 1;
    else if (KEY_PATTERN.test(key)) candidates.push(key);
    else leftovers.push(key);
  }
  const referenced = await referencedKeys(dataSource);
  let deleted = 0;
  for (const key of candidates) {
    if (referenced.has(key)) continue;
    const modifiedAt = await storage.modifiedAt(key);
    if (!modifiedAt || now - modifiedAt.getTime() <= graceMs) continue;
    await storage.delete(key);
    deleted += 1;
  }
  for (const name of leftovers) {
    await storage.deleteLeftover?.(name);
    deleted += 1;
  }
  return { scanned, deleted, keptYoung };
}
