import type { DataSource, EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { BladeFit, BladeView, MachineView, machineInputSchema } from '@shared/schemas/shop';
import { BLADE_NEAR_DAYS, BLADE_NEAR_SHARE } from '@shared/schemas/shop';
import { notFound, validationError } from '../../lib/errors';
import { IsNull } from 'typeorm';
import { inTransaction } from '../../db/transaction';
import { Blade, Machine } from './machine.entity';

/** A blade's wear by length (90 % of its replacement length: near; all of it: due) and by its replace-by date. */
const bladeView = (b: Blade, today = new Date().toISOString().slice(0, 10)): BladeView => {
  const cutLengthM = b.cutLengthMm / 1000,
    lifeM = b.lifeM;
  const replaceBy = b.replaceBy;
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
    id: b.id,
    label: b.label,
    fittedOn: b.fittedOn,
    removedOn: b.removedOn,
    cutLengthM,
    lifeM,
    price: b.price,
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
    const machines = await this.dataSource
      .getRepository(Machine)
      .find({ where: { teamId, archivedAt: IsNull() }, order: { kind: 'ASC', name: 'ASC' } });
    const blades = await this.dataSource.getRepository(Blade).find({ where: { teamId }, order: { fittedOn: 'DESC', id: 'DESC' } });
    return machines.map((m) => {
      const own = blades.filter((b) => b.cutterId === m.id).map((b) => bladeView(b));
      return {
        id: m.id,
        kind: m.kind,
        name: m.name,
        notes: m.notes ?? '',
        inkFullPage: m.inkFullPage,
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
    const repo = this.dataSource.getRepository(Machine);
    const saved = await repo.save(
      repo.create({
        teamId,
        kind: input.kind,
        name: input.name,
        notes: input.notes || null,
        inkFullPage: input.kind === 'printer' ? input.inkFullPage : null,
      }),
    );
    return this.get(teamId, saved.id);
  }

  async update(teamId: string, id: string, input: z.infer<typeof machineInputSchema>): Promise<MachineView> {
    const machine = await this.get(teamId, id);
    if (machine.kind !== input.kind) throw validationError({ kind: 'A printer stays a printer and a cutter a cutter' });
    await this.dataSource
      .getRepository(Machine)
      .update(
        { id, teamId },
        { name: input.name, notes: input.notes || null, inkFullPage: input.kind === 'printer' ? input.inkFullPage : null },
      );
    return this.get(teamId, id);
  }

  async archive(teamId: string, id: string): Promise<void> {
    await this.get(teamId, id);
    await this.dataSource.getRepository(Machine).update({ id, teamId }, { archivedAt: new Date() });
  }

  /** Fits a new blade: the one in the cutter is logged as removed that day, with the length it cut. */
  async fitBlade(teamId: string, cutterId: string, userId: string, fit: BladeFit): Promise<MachineView> {
    const cutter = await this.get(teamId, cutterId);
    if (cutter.kind !== 'cutter') throw notFound('That cutter');
    await inTransaction(this.dataSource, async (manager) => {
      const blades = manager.getRepository(Blade);
      await blades.update({ cutterId, removedOn: IsNull() }, { removedOn: fit.fittedOn });
      await blades.save(
        blades.create({
          teamId,
          cutterId,
          label: fit.label,
          fittedOn: fit.fittedOn,
          lifeM: fit.lifeM,
          price: fit.price,
          note: fit.note || null,
          fittedBy: userId,
          replaceBy: fit.replaceBy,
        }),
      );
    });
    return this.get(teamId, cutterId);
  }

  /** A team machine of the given kind, read inside a transaction. */
  async machineIn(manager: EntityManager, teamId: string, id: string, kind: 'printer' | 'cutter'): Promise<Machine> {
    const row = await manager.getRepository(Machine).findOneBy({ id, teamId, kind });
    if (!row) throw notFound(kind === 'printer' ? 'That printer' : 'That cutter');
    return row;
  }

  /** The blade fitted in a cutter, locked for the rest of the transaction. */
  async fittedBlade(manager: EntityManager, cutterId: string): Promise<Blade | null> {
    return manager
      .getRepository(Blade)
      .createQueryBuilder('b')
      .where('b.cutter_id = :cutterId AND b.removed_on IS NULL', { cutterId })
      .orderBy('b.id', 'DESC')
      .setLock('pessimistic_write')
      .getOne();
  }
}
