// Proofs: what the buyer approves before anything is printed. Sending one freezes the order's lines
// (names, finished sizes, stock, prices) and a picture of each sticker with its cut line into the
// proof, mails the buyer a link with a 256-bit token (only its SHA-256 is stored) that expires, and
// puts the order with the buyer. The buyer approves with their typed name (time and address kept)
// or asks for changes; either way the shop is told by e-mail. An answered proof never changes.
import sharp from 'sharp';
import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import type { Env } from '../../config/env';
import { formatMinor, orderTotal } from '@shared/orders/money';
import { AppError, conflict, notFound } from '../../lib/errors';
import { hashToken, newToken } from '../../lib/tokens';
import type { Mailer } from '../../mail/mailer';
import type { Storage } from '../../storage/storage';
import { inTransaction } from '../../db/transaction';
import { User } from '../accounts/user.entity';
import { ArtItem } from '../art/art-item.entity';
import type { OutlineService } from '../outlines/outline.service';
import type { ProfilesService } from '../sheets/profiles.service';
import { Sheet } from '../sheets/sheet.entity';
import { StockItem } from '../shop/stock-item.entity';
import { Customer } from './customer.entity';
import { Order } from './order.entity';
import type { ProofSnapshot } from './order-view';
import type { OrderActor, OrdersService } from './orders.service';
import { SINGLES_BORDER_MM } from './pricing';
import { OrderProof } from './proof.entity';

/** Pixels per millimetre of the proof pictures (150 DPI: plenty on screen). */
const PROOF_PX_PER_MM = 150 / 25.4;

const gone = (message: string) => new AppError(410, 'proof_closed', message);

/** A sticker on a light backdrop with its cut line drawn over it in magenta, as a PNG. */
async function proofPicture(png: Buffer, piece: { widthMm: number; heightMm: number; cutLine: { svgPath: string } }): Promise<Buffer> {
  const pad = 4; // mm around the sticker
  const w = Math.round((piece.widthMm + 2 * pad) * PROOF_PX_PER_MM),
    h = Math.round((piece.heightMm + 2 * pad) * PROOF_PX_PER_MM);
  const art = await sharp(png)
    .resize(Math.round(piece.widthMm * PROOF_PX_PER_MM), Math.round(piece.heightMm * PROOF_PX_PER_MM), { fit: 'fill' })
    .png()
    .toBuffer();
  const line = Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}" viewBox="${-pad} ${-pad} ${piece.widthMm + 2 * pad} ${piece.heightMm + 2 * pad}"><path d="${piece.cutLine.svgPath}" fill="none" stroke="#e0198a" stroke-width="0.35"/></svg>`,
  );
  const offset = Math.round(pad * PROOF_PX_PER_MM);
  return sharp({ create: { width: w, height: h, channels: 4, background: '#e9e4da' } })
    .composite([
      { input: art, left: offset, top: offset },
      { input: line, left: 0, top: 0 },
    ])
    .png()
    .toBuffer();
}

export class ProofsService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly orders: OrdersService,
    private readonly outlines: OutlineService,
    private readonly profiles: ProfilesService,
    private readonly storage: Storage,
    private readonly mailer: Mailer,
    private readonly env: Pick<Env, 'appUrl' | 'PROOF_LINK_DAYS'>,
  ) {}

  /** Freezes the order as it is now into a proof, mails the buyer its link and puts the order with them. */
  async send(actor: OrderActor, orderId: string, message: string) {
    const order = await this.orders.order(actor.teamId, orderId);
    if (order.state !== 'quote' && order.state !== 'changes')
      throw conflict(
        order.state === 'proof-out'
          ? 'A proof is already with the buyer: wait for their answer.'
          : 'The buyer has approved this order: what they approved stays as it was.',
      );
    const lines = await this.orders.lines(orderId);
    if (lines.length === 0)
      throw new AppError(
        400,
        'validation_failed',
        'This order has no stickers yet: add the art or sheet the buyer wants, then send the proof.',
      );
    const profile = await this.profiles.defaultFor(actor.teamId);
    const limits = { minFeatureMm: profile.minFeatureMm, bridgeWidthMm: profile.bridgeWidthMm };
    const arts = await this.dataSource.getRepository(ArtItem).findBy({ id: In(['0', ...lines.map((l) => l.artId ?? '0')]) });
    const sheets = await this.dataSource.getRepository(Sheet).findBy({ id: In(['0', ...lines.map((l) => l.sheetId ?? '0')]) });
    const stock = await this.dataSource.getRepository(StockItem).findBy({ id: In(['0', ...lines.map((l) => l.stockId ?? '0')]) });
    const snapshot: ProofSnapshot = {
      orderNumber: order.number,
      currency: order.currency,
      depositPercent: order.depositPercent,
      lines: [],
      totalMinor: orderTotal(lines),
    };
    for (const line of lines) {
      const stockName = stock.find((s) => s.id === line.stockId)?.name ?? null;
      const priced = {
        quantity: line.quantity,
        stockName,
        unitPriceMinor: line.unitPriceMinor,
        totalMinor: line.unitPriceMinor * line.quantity,
      };
      if (line.kind === 'singles') {
        const art = arts.find((a) => a.id === line.artId && !a.deletedAt);
        if (!art) throw conflict(`Line ${line.position + 1}'s art was removed from the library: remove the line or add the art again.`);
        const width = line.finishedWidthMm! - 2 * SINGLES_BORDER_MM;
        const { outline } = await this.outlines.forPiece(art, { width, border: SINGLES_BORDER_MM, borderColour: '#ffffff' }, limits);
        const piece = outline.pieces[0];
        const picture = await proofPicture(await this.storage.get(piece.pngKey), piece);
        const { key } = await this.storage.put(picture);
        snapshot.lines.push({
          kind: 'singles',
          title: art.name,
          finishedWidthMm: piece.widthMm,
          finishedHeightMm: piece.heightMm,
          imageKey: key,
          ...priced,
        });
      } else {
        const sheet = sheets.find((s) => s.id === line.sheetId);
        if (!sheet) throw conflict(`Line ${line.position + 1}'s sheet was deleted: remove the line.`);
        snapshot.lines.push({
          kind: 'sheet',
          title: sheet.name,
          finishedWidthMm: null,
          finishedHeightMm: null,
          imageKey: sheet.thumbnailKey,
          ...priced,
        });
      }
    }
    const customer = await this.dataSource.getRepository(Customer).findOneByOrFail({ id: order.customerId });
    const { token, hash } = newToken();
    const expiresAt = new Date(Date.now() + this.env.PROOF_LINK_DAYS * 86_400_000);
    await inTransaction(this.dataSource, async (manager) => {
      const locked = await this.orders.order(actor.teamId, orderId, manager, true);
      if (locked.state !== 'quote' && locked.state !== 'changes') throw conflict('Someone else sent a proof of this order just now.');
      await manager.getRepository(OrderProof).update({ orderId, status: 'open' }, { status: 'replaced' });
      await manager.getRepository(OrderProof).insert({
        orderId,
        tokenHash: hash,
        sentTo: customer.email,
        expiresAt,
        snapshotJson: JSON.stringify(snapshot),
        createdBy: actor.userId!,
      });
      await manager.getRepository(Order).update({ id: orderId }, { state: 'proof-out' });
      await this.orders.record(manager, orderId, actor, `Sent a proof to ${customer.email}`);
    });
    const link = `${this.env.appUrl}/proof/${token}`;
    const total = formatMinor(snapshot.totalMinor, order.currency);
    await this.mailer.send({
      to: customer.email,
      subject: `Your sticker proof, order ${order.number}`,
      text: [
        `Hello ${customer.name},`,
        '',
        `Here is the proof of your stickers (order ${order.number}, ${total}). Please check the pictures, sizes and quantities, then approve it or tell us what to change:`,
        '',
        link,
        '',
        ...(message ? [message, ''] : []),
        `The link works until ${expiresAt.toISOString().slice(0, 10)}. Nothing is printed before you approve.`,
      ].join('\n'),
    });
    return { link, expiresAt: expiresAt.toISOString() };
  }

  /** The proof behind a link: unknown 404; expired, replaced 410. */
  async open(token: string) {
    const proof = await this.dataSource.getRepository(OrderProof).findOneBy({ tokenHash: hashToken(token) });
    if (!proof) throw notFound('That proof');
    const newer = await this.dataSource
      .getRepository(OrderProof)
      .createQueryBuilder('p')
      .where('p.order_id = :orderId AND p.id > :id', proof)
      .getExists();
    if (proof.status === 'replaced' || newer) throw gone('A newer proof of this order was sent: please use the link in the latest e-mail.');
    if (proof.status === 'open' && proof.expiresAt.getTime() < Date.now())
      throw gone('This proof link has expired: ask the shop to send it again.');
    const order = await this.dataSource.getRepository(Order).findOneByOrFail({ id: proof.orderId });
    return { proof, order, snapshot: JSON.parse(proof.snapshotJson) as ProofSnapshot };
  }

  async picture(token: string, index: number): Promise<Buffer> {
    const { snapshot } = await this.open(token);
    const key = snapshot.lines[index]?.imageKey;
    if (!key) throw notFound('That picture');
    return this.storage.get(key);
  }

  /** A proof's picture as sent, for the team's members (another team's order: 404). */
  async memberPicture(teamId: string, orderId: string, proofId: string, index: number): Promise<Buffer> {
    await this.orders.order(teamId, orderId);
    const proof = await this.dataSource.getRepository(OrderProof).findOneBy({ id: proofId, orderId });
    const key = proof ? (JSON.parse(proof.snapshotJson) as ProofSnapshot).lines[index]?.imageKey : null;
    if (!key) throw notFound('That picture');
    return this.storage.get(key);
  }

  /** The buyer's answer: approved with their typed name, or changes with a comment. */
  async answer(token: string, answer: { approve: true; name: string } | { approve: false; comment: string }, address: string) {
    const { proof, order } = await this.open(token);
    await inTransaction(this.dataSource, async (manager) => {
      const locked = await manager
        .getRepository(OrderProof)
        .createQueryBuilder('p')
        .where('p.id = :id', { id: proof.id })
        .setLock('pessimistic_write')
        .getOneOrFail();
      if (locked.status !== 'open')
        throw conflict(
          locked.status === 'approved'
            ? 'This proof is already approved: nothing more to do here.'
            : 'You already asked for changes to this proof: the shop will send a new one.',
        );
      const decided = { decidedAt: new Date(), decidedAddress: address.slice(0, 64) };
      const customer = await manager.getRepository(Customer).findOneByOrFail({ id: order.customerId });
      if (answer.approve) {
        await manager.getRepository(OrderProof).update({ id: proof.id }, { ...decided, status: 'approved', decidedName: answer.name });
        await manager.getRepository(Order).update({ id: order.id }, { state: 'approved' });
        await this.orders.record(
          manager,
          order.id,
          { userId: null, name: `${customer.name} (buyer)` },
          `Approved the proof, typed name "${answer.name}"`,
        );
      } else {
        await manager.getRepository(OrderProof).update({ id: proof.id }, { ...decided, status: 'changes', comment: answer.comment });
        await manager.getRepository(Order).update({ id: order.id }, { state: 'changes' });
        await this.orders.record(
          manager,
          order.id,
          { userId: null, name: `${customer.name} (buyer)` },
          `Asked for changes: ${answer.comment}`,
        );
      }
    });
    const sender = await this.dataSource.getRepository(User).findOneBy({ id: proof.createdBy });
    if (sender)
      await this.mailer.send({
        to: sender.email,
        subject: answer.approve ? `Order ${order.number}: proof approved` : `Order ${order.number}: changes asked`,
        text: answer.approve
          ? `The buyer approved the proof of order ${order.number} (typed name "${answer.name}").\n\n${this.env.appUrl}/t/${order.teamId}/orders/${order.id}`
          : `The buyer asked for changes to order ${order.number}:\n\n${answer.comment}\n\n${this.env.appUrl}/t/${order.teamId}/orders/${order.id}`,
      });
  }
}
