import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { OrderCurrency } from '@shared/orders/money';
import type { OrderState } from '@shared/schemas/orders';
import { ORDER_STATES } from '@shared/schemas/orders';
import { decimal } from '../../db/columns';

/** A buyer's order: its state, currency, deposit share and what has been paid (whole cents). */
@Entity({ name: 'orders' })
export class Order {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  /** The team's own running number (1, 2, 3 …), what buyers and the shop call the order. */
  @Column({ type: 'int', unsigned: true })
  number!: number;

  @Column({ name: 'customer_id', type: 'bigint', unsigned: true })
  customerId!: string;

  @Column({ type: 'enum', enum: ORDER_STATES, default: 'quote' })
  state!: OrderState;

  @Column({ type: 'char', length: 3 })
  currency!: OrderCurrency;

  @Column({ name: 'deposit_percent', type: 'tinyint', unsigned: true, default: 50 })
  depositPercent!: number;

  @Column({ type: 'text', nullable: true })
  notes!: string | null;

  @Column({ name: 'paid_minor', type: 'int', default: 0 })
  paidMinor!: number;

  @Column({ name: 'refunded_minor', type: 'int', default: 0 })
  refundedMinor!: number;

  @Column({ name: 'created_by', type: 'bigint', unsigned: true })
  createdBy!: string;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;
}

/** One line: die-cut singles of one art at a finished width, or copies of a sheet. */
@Entity({ name: 'order_lines' })
export class OrderLine {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'order_id', type: 'bigint', unsigned: true })
  orderId!: string;

  @Column({ type: 'int', unsigned: true })
  position!: number;

  @Column({ type: 'enum', enum: ['singles', 'sheet'] })
  kind!: 'singles' | 'sheet';

  @Column({ name: 'art_id', type: 'bigint', unsigned: true, nullable: true })
  artId!: string | null;

  @Column({ name: 'sheet_id', type: 'bigint', unsigned: true, nullable: true })
  sheetId!: string | null;

  @Column({ name: 'finished_width_mm', ...decimal(8, 3), nullable: true })
  finishedWidthMm!: number | null;

  @Column({ type: 'int', unsigned: true })
  quantity!: number;

  @Column({ name: 'stock_id', type: 'bigint', unsigned: true, nullable: true })
  stockId!: string | null;

  @Column({ name: 'unit_price_minor', type: 'int' })
  unitPriceMinor!: number;

  /** 'cost': from the cost model at the shop's markup; 'hand': typed by the shop. */
  @Column({ name: 'price_from', type: 'enum', enum: ['cost', 'hand'] })
  priceFrom!: 'cost' | 'hand';

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;
}

/** What happened to an order, by whom and when (a member, the buyer on the proof page, or the payment service). */
@Entity({ name: 'order_events' })
export class OrderEvent {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'order_id', type: 'bigint', unsigned: true })
  orderId!: string;

  @Column({ name: 'user_id', type: 'bigint', unsigned: true, nullable: true })
  userId!: string | null;

  @Column({ type: 'varchar', length: 160 })
  who!: string;

  @Column({ type: 'varchar', length: 600 })
  what!: string;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;
}
