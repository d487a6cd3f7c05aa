import { Column, CreateDateColumn, Entity, PrimaryColumn, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { OrderCurrency } from '@shared/orders/money';

/** A payment asked of the buyer (a checkout session) or a refund, in whole cents. */
@Entity({ name: 'order_payments' })
export class OrderPayment {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'order_id', type: 'bigint', unsigned: true })
  orderId!: string;

  @Column({ type: 'enum', enum: ['deposit', 'balance', 'refund'] })
  kind!: 'deposit' | 'balance' | 'refund';

  @Column({ type: 'enum', enum: ['open', 'paid', 'refunded', 'expired'], default: 'open' })
  status!: 'open' | 'paid' | 'refunded' | 'expired';

  @Column({ name: 'amount_minor', type: 'int' })
  amountMinor!: number;

  @Column({ type: 'char', length: 3 })
  currency!: OrderCurrency;

  @Column({ name: 'session_id', type: 'varchar', length: 255, nullable: true })
  sessionId!: string | null;

  @Column({ name: 'payment_intent', type: 'varchar', length: 255, nullable: true })
  paymentIntent!: string | null;

  @Column({ name: 'refund_id', type: 'varchar', length: 255, nullable: true })
  refundId!: string | null;

  @Column({ name: 'created_by', type: 'bigint', unsigned: true, nullable: true })
  createdBy!: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;
}

/** A notice from the payment service already acted on: its id is kept so a replay changes nothing. */
@Entity({ name: 'payment_notices' })
export class PaymentNotice {
  @PrimaryColumn({ name: 'event_id', type: 'varchar', length: 255 })
  eventId!: string;

  @Column({ type: 'varchar', length: 100 })
  type!: string;

  @Column({ name: 'order_id', type: 'bigint', unsigned: true, nullable: true })
  orderId!: string | null;

  @CreateDateColumn({ name: 'received_at', type: 'datetime', precision: 3 })
  receivedAt!: Date;
}
