// The demo shop's sheets and print runs: arranged by the same nester the editor uses, on outlines
// from the same cache, costed, and printed a few times over recent weeks, so the sheets table, the
// editor's cost section and the print room's history all have something true to show.
import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import { demoTeam, demoUserKey } from './accounts';
import { Sheet } from '../../modules/sheets/sheet.entity';
import { arrange } from '@shared/arrange/nester';
import type { ArrangeItem } from '@shared/arrange/nester';
import { printRunInputSchema } from '@shared/schemas/shop';
import type { Piece, SheetDocument } from '@shared/sheet/document';
import { DEFAULT_PREFLIGHT_LIMITS } from '@shared/sheet/preflight';
import { inchToMm } from '@shared/units';
import { env } from '../../config/env';
import { OutlinePool } from '../../engine/outline/pool';
import { ArtItem } from '../../modules/art/art-item.entity';
import { User } from '../../modules/accounts/user.entity';
import type { StoredOutline } from '../../modules/outlines/outline.service';
import { OutlineService } from '../../modules/outlines/outline.service';
import { CostingService } from '../../modules/shop/costing.service';
import { MachinesService } from '../../modules/shop/machines.service';
import { RunsService } from '../../modules/shop/runs.service';
import { SheetAnalysisService } from '../../modules/shop/sheet-analysis.service';
import { StockService } from '../../modules/shop/stock.service';
import { ProfilesService } from '../../modules/sheets/profiles.service';
import { SheetsService } from '../../modules/sheets/sheets.service';
import type { Storage } from '../../storage/storage';

type DemoSheet = {
  name: string;
  owner: string;
  status: 'draft' | 'ready' | 'printed';
  forSale: boolean;
  notes: string;
  stock: string;
  /** Art name, count, printed width in inches. */
  art: Array<[string, number, number]>;
  runs: Array<{
    by: string;
    printedOn: string;
    copies: number;
    result: 'good' | 'misaligned' | 'tore' | 'other';
    wasted?: number;
    notes?: string;
  }>;
};

const SHEETS: DemoSheet[] = [
  {
    name: 'Garden party, market sheet',
    owner: 'owner@demo.test',
    status: 'printed',
    forSale: true,
    notes: 'For the Saturday craft market table.',
    stock: 'Puddle glossy sticker paper',
    art: [
      ['tulip-trio', 2, 1.5],
      ['sun-flower', 3, 1.4],
      ['bumble-bee', 3, 1.3],
      ['lady-bugs', 2, 1.5],
      ['snail-shell', 2, 1.4],
    ],
    runs: [
      { by: 'member@demo.test', printedOn: '2026-11-09', copies: 4, result: 'good' },
      {
        by: 'member@demo.test',
        printedOn: '2026-11-16',
        copies: 2,
        result: 'misaligned',
        notes: 'Registration marks smudged; cut drifted right. Reprinted.',
      },
      { by: 'owner@demo.test', printedOn: '2026-11-17', copies: 6, result: 'good' },
      { by: 'member@demo.test', printedOn: '2026-11-26', copies: 5, result: 'good', notes: 'Market restock.' },
    ],
  },
  {
    name: 'Space doodles for the Hartwell kids',
    owner: 'member@demo.test',
    status: 'ready',
    forSale: false,
    notes: 'A gift sheet: the pack is personal-use only.',
    stock: 'Frosted clear vinyl',
    art: [
      ['rocket-ship', 2, 1.6],
      ['ringed-planet', 2, 1.5],
      ['crescent-moon', 2, 1.2],
      ['ufo-saucer', 2, 1.4],
      ['astro-helmet', 1, 1.7],
    ],
    runs: [
      {
        by: 'member@demo.test',
        printedOn: '2026-11-20',
        copies: 1,
        result: 'tore',
        notes: 'Vinyl lifted at the moon tips: try two passes at lower pressure.',
      },
    ],
  },
];

const BORDER_MM = inchToMm(0.125);

/** Adds the demo sheets and their runs when the demo shop has none; returns how many rows it added. */
export async function seedSheets(dataSource: DataSource, storage: Storage): Promise<number> {
  const team = await demoTeam(dataSource);
  // A demo sheet counts as there once saved with its pieces (version > 1); an interrupted seed's empty one is filled in.
  const present = await dataSource
    .getRepository(Sheet)
    .find({ where: { teamId: team.id }, select: { id: true, name: true, version: true } });
  const todo = SHEETS.filter((spec) => !present.some((p) => p.name === spec.name && p.version > 1));
  if (todo.length === 0) return 0;
  const pool = new OutlinePool({ maxInputPixels: env.OUTLINE_MAX_PIXELS, maxOutputPixels: env.OUTLINE_MAX_OUTPUT_PIXELS }, 1);
  try {
    const outlines = new OutlineService(dataSource, storage, pool);
    const sheets = new SheetsService(dataSource, storage, new ProfilesService(dataSource));
    const analysis = new SheetAnalysisService(dataSource, storage, outlines);
    const stock = new StockService(dataSource);
    const machines = new MachinesService(dataSource);
    const runs = new RunsService(dataSource, storage, sheets, stock, machines, analysis);
    const costing = new CostingService(dataSource, sheets, analysis);
    const people = new Map(
      (await dataSource.getRepository(User).findBy({ seedKey: In(['owner@demo.test', 'member@demo.test'].map(demoUserKey)) })).map((u) => [
        u.email,
        u.id,
      ]),
    );
    const shelf = await stock.list(team.id);
    const bench = await machines.list(team.id);
    const printer = bench.find((m) => m.kind === 'printer') ?? null;
    const cutter = bench.find((m) => m.kind === 'cutter') ?? null;
    let added = 0;

    for (const spec of todo) {
      const actor = { userId: people.get(spec.owner)!, teamId: team.id, role: 'owner' as const };
      const arts = new Map(
        (await dataSource.getRepository(ArtItem).findBy({ teamId: team.id, name: In(spec.art.map(([name]) => name)) })).map((a) => [
          a.name,
          a,
        ]),
      );
      const items: ArrangeItem[] = [];
      const templates = new Map<string, Piece>();
      const byArt = new Map<string, StoredOutline>();
      for (const [name, count, widthIn] of spec.art) {
        const art = arts.get(name);
        if (!art) continue;
        const template: Piece = {
          id: '',
          artId: art.id,
          x: 0,
          y: 0,
          rotation: 0,
          width: inchToMm(widthIn),
          border: BORDER_MM,
          borderColour: '#ffffff',
          locked: false,
        };
        const { outline } = await outlines.forPiece(art, template, DEFAULT_PREFLIGHT_LIMITS);
        const first = outline.pieces[0];
        items.push({ key: name, outline: { points: first.cutLine.points, widthMm: first.widthMm, heightMm: first.heightMm }, count });
        templates.set(name, template);
        byArt.set(art.id, outline);
      }
      // Everything slow happens before the sheet exists, so an interruption rarely leaves an empty one.
      const empty = present.find((p) => p.name === spec.name);
      const created = empty ? await sheets.detail(team.id, String(empty.id)) : await sheets.create(actor, { name: spec.name, unit: 'in' });
      const doc: SheetDocument = created.document;
      const result = arrange(items, {
        width: doc.printArea.width,
        height: doc.printArea.height,
        gap: doc.minGap,
        margin: doc.safeMargin,
        rotate: '90',
        fill: false,
        timeMs: 1500,
        seed: 7,
        maxSheets: 1,
      });
      const pieces = result.placements
        .filter((p) => p.sheet === 0)
        .map((p, i) => ({ ...templates.get(p.key)!, id: `demo-${i + 1}`, x: p.x, y: p.y, rotation: p.rotation }));
      const document = { ...doc, pieces };
      const area = pieces.reduce((sum, p) => sum + byArt.get(p.artId)!.pieces[0].areaMm2, 0);
      const saved = await sheets.save(actor, created.id, {
        version: created.version,
        document,
        status: spec.status,
        forSale: spec.forSale,
        notes: spec.notes,
        areaUsed: area / (doc.printArea.width * doc.printArea.height),
      });
      // The sheet's checks, and with them its thumbnail (the editor replaces it with its own on the next save).
      await analysis.analyse(team.id, await sheets.find(team.id, saved.id));
      const chosen = shelf.find((s) => s.name === spec.stock) ?? null;
      await costing.setCosting(team.id, saved.id, {
        stockId: chosen?.id ?? null,
        printerId: printer?.id ?? null,
        cutterId: cutter?.id ?? null,
        labourMinutes: 6,
      });
      added += 1;
      for (const run of spec.runs) {
        if (!chosen) break;
        await runs.record(
          team.id,
          people.get(run.by)!,
          printRunInputSchema.parse({
            sheetId: saved.id,
            stockId: chosen.id,
            printerId: printer?.id ?? null,
            cutterId: cutter?.id ?? null,
            ...run,
            confirmNegativeStock: true,
          }),
        );
        added += 1;
      }
    }
    return added;
  } finally {
    await pool.close();
  }
}
