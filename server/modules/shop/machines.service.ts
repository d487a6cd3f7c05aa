import type { DataSource, EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { BladeFit, BladeView, MachineView, machineInputSchema } from '../../../shared/schemas/shop';
import { BLADE_NEAR_DAYS, BLADE_NEAR_SHARE } from '../../../shared/schemas/shop';
import { notFound, validationError } from '../../lib/errors';
import { inTransaction } from '../../db/transaction';

type MachineRow = {
  id: string;
  kind: 'printer' | 'cutter';
  name: string;
  notes: string | null;
  ink_full_page: string | null;
  archived_at: Date | null;
};
type BladeRow = {
  id: string;
  cutter_id: string;
  label: string;
  fitted_on: string | Date;
  removed_on: string | Date | null;
  cut_length_mm: number;
  life_m: string;
  price: string;
  note: string | null;
  replace_by: string | Date | null;
};

const isoDay = (d: string | Date | null) =>
  d === null
    ? null
    : typeof d === 'string'
      ? d.slice(0, 10)
      : `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;

/** A blade's wear by length (90 % of its replacement length: near; all of it: due) and by its replace-by date. */
export const bladeView = (b: BladeRow, today = isoDay(new Date())!): BladeView => {
  const cutLengthM = b.cut_length_mm / 1000,
    lifeM = Number(b.life_m);
  const replaceBy = isoDay(b.replace_by);
  const daysLeft = replaceBy === null ? Infinity : (Date.parse(replaceBy) - Date.parse(today)) / 86_400_000;
  const byLength = cutLengthM >= lifeM ? 'due' : cutLengthM >= BLADE_NEAR_SHARE * lifeM ? 'near' : 'ok';
  const byDate = daysLeft <= 0 ? 'due' : daysLeft <= BLADE_NEAR_DAYS ? 'near' : 'ok';
  const rank = { ok: 0, near: 1, due: 2 } as const;
  const wear = rank[byLength] >= rank[byDate] ? byLength : byDate;
  const reasons = [
    byLength !== 'ok' && `cut ${cutLengthM.toFixed(1)} of ${lifeM} m`,
    byDate !== 'ok' && (daysLeft <= 0 ? `replace-by date ${replaceBy} reached` : `replace by ${replaceBy}`),
  ].filter((r): r is string => Boolean(r));
  return {
    id: String(b.id),
    label: b.label,
    fittedOn: isoDay(b.fitted_on)!,
    removedOn: isoDay(b.removed_on),
    cutLengthM,
    lifeM,
    price: Number(b.price),
    note: b.note ?? '',
    replaceBy,
    wear,
    wearReason: reasons.length ? reasons.join('; ') : null,
  };
};

/** Printers and cutters, and each cutter's blades: the fitted one and the log of those it replaced. */
export class MachinesService {
  constructor(private readonly dataSource: DataSource) {}

  async list(teamId: string): Promise<MachineView[]> {
    const machines: MachineRow[] = await this.dataSource.query(
      'SELECT * FROM machines WHERE team_id = ? AND archived_at IS NULL ORDER BY kind, name',
      [teamId],
    );
    const blades: BladeRow[] = await this.dataSource.query('SELECT * FROM blades WHERE team_id = ? ORDER BY fitted_on DESC, id DESC', [
      teamId,
    ]);
    return machines.map((m) => {
      const own = blades.filter((b) => String(b.cutter_id) === String(m.id)).map((b) => bladeView(b));
      return {
        id: String(m.id),
        kind: m.kind,
        name: m.name,
        notes: m.notes ?? '',
        inkFullPage: m.ink_full_page === null ? null : Number(m.ink_full_page),
        blade: own.find((b) => b.removedOn === null) ?? null,
        blades: own,
      };
    });
  }

  async get(teamId: string, id: string): Promise<MachineView> {
    const machine = (await this.list(teamId)).find((m) => m.id === id);
    if (!machine) throw notFound('That machine');
    return machine;
  }

  async create(teamId: string, input: z.infer<typeof machineInputSchema>): Promise<MachineView> {
    const r = await this.dataSource.query('INSERT INTO machines (team_id, kind, name, notes, ink_full_page) VALUES (?,?,?,?,?)', [
      teamId,
      input.kind,
      input.name,
      input.notes || null,
      input.kind === 'printer' ? input.inkFullPage : null,
    ]);
    return this.get(teamId, String(r.insertId));
  }

  async update(teamId: string, id: string, input: z.infer<typeof machineInputSchema>): Promise<MachineView> {
    const machine = await this.get(teamId, id);
    if (machine.kind !== input.kind) throw validationError({ kind: 'A printer stays a printer and a cutter a cutter' });
    await this.dataSource.query('UPDATE machines SET name = ?, notes = ?, ink_full_page = ? WHERE id = ?', [
      input.name,
      input.notes || null,
      input.kind === 'printer' ? input.inkFullPage : null,
      id,
    ]);
    return this.get(teamId, id);
  }

  async archive(teamId: string, id: string): Promise<void> {
    await this.get(teamId, id);
    await this.dataSource.query('UPDATE machines SET archived_at = CURRENT_TIMESTAMP(3) WHERE id = ?', [id]);
  }

  /** Fits a new blade: the one in the cutter is logged as removed that day, with the length it cut. */
  async fitBlade(teamId: string, cutterId: string, userId: string, fit: BladeFit): Promise<MachineView> {
    const cutter = await this.get(teamId, cutterId);
    if (cutter.kind !== 'cutter') throw notFound('That cutter');
    await inTransaction(this.dataSource, async (manager) => {
      await manager.query('UPDATE blades SET removed_on = ? WHERE cutter_id = ? AND removed_on IS NULL', [fit.fittedOn, cutterId]);
      await manager.query(
        'INSERT INTO blades (team_id, cutter_id, label, fitted_on, life_m, price, note, fitted_by, replace_by) VALUES (?,?,?,?,?,?,?,?,?)',
        [teamId, cutterId, fit.label, fit.fittedOn, fit.lifeM, fit.price, fit.note || null, userId, fit.replaceBy],
      );
    });
    return this.get(teamId, cutterId);
  }

  /** A team machine of the given kind, read inside a transaction. */
  async machineIn(manager: EntityManager, teamId: string, id: string, kind: 'printer' | 'cutter'): Promise<MachineRow> {
    const [row] = await manager.query('SELECT * FROM machines WHERE id = ? AND team_id = ? AND kind = ?', [id, teamId, kind]);
    if (!row) throw notFound(kind === 'printer' ? 'That printer' : 'That cutter');
    return row;
  }

  /** The blade fitted in a cutter, locked for the rest of the transaction. */
  async fittedBlade(manager: EntityManager, cutterId: string): Promise<BladeRow | null> {
    const [row] = await manager.query(
      'SELECT * FROM blades WHERE cutter_id = ? AND removed_on IS NULL ORDER BY id DESC LIMIT 1 FOR UPDATE',
      [cutterId],
    );
    return row ?? null;
  }
}
