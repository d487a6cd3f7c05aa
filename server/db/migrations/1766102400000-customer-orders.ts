import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Buyers' orders: customers, orders with their lines and a log of every change, proofs the buyer
 * answers from a signed link (frozen as sent), payments and the payment service's notices (each
 * notice id once, so a replay changes nothing). Sheets and print runs may belong to an order.
 * Money is whole cents (INT).
 */
export class CustomerOrders1766102400000 implements MigrationInterface {
  name = 'CustomerOrders1766102400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE customers (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      team_id BIGINT UNSIGNED NOT NULL,
      name VARCHAR(120) NOT NULL,
      email VARCHAR(254) NOT NULL,
      notes TEXT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      KEY customers_team (team_id, name),
      CONSTRAINT customers_team_fk FOREIGN KEY (team_id) REFERENCES teams (id) ON DELETE CASCADE
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await q.query(`CREATE TABLE orders (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      team_id BIGINT UNSIGNED NOT NULL,
      number INT UNSIGNED NOT NULL,
      customer_id BIGINT UNSIGNED NOT NULL,
      state ENUM('quote','proof-out','changes','approved','deposit','paid','making','ready','handed-over','cancelled') NOT NULL DEFAULT 'quote',
      currency CHAR(3) NOT NULL,
      deposit_percent TINYINT UNSIGNED NOT NULL DEFAULT 50,
      notes TEXT NULL,
      paid_minor INT NOT NULL DEFAULT 0,
      refunded_minor INT NOT NULL DEFAULT 0,
      created_by BIGINT UNSIGNED NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE KEY orders_team_number (team_id, number),
      KEY orders_team_state (team_id, state),
      CONSTRAINT orders_team_fk FOREIGN KEY (team_id) REFERENCES teams (id) ON DELETE CASCADE,
      CONSTRAINT orders_customer_fk FOREIGN KEY (customer_id) REFERENCES customers (id)
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await q.query(`CREATE TABLE order_lines (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      order_id BIGINT UNSIGNED NOT NULL,
      position INT UNSIGNED NOT NULL,
      kind ENUM('singles','sheet') NOT NULL,
      art_id BIGINT UNSIGNED NULL,
      sheet_id BIGINT UNSIGNED NULL,
      finished_width_mm DECIMAL(8,3) NULL,
      quantity INT UNSIGNED NOT NULL,
      stock_id BIGINT UNSIGNED NULL,
      unit_price_minor INT NOT NULL,
      price_from ENUM('cost','hand') NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      KEY order_lines_order (order_id, position),
      CONSTRAINT order_lines_order_fk FOREIGN KEY (order_id) REFERENCES orders (id) ON DELETE CASCADE
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await q.query(`CREATE TABLE order_events (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      order_id BIGINT UNSIGNED NOT NULL,
      user_id BIGINT UNSIGNED NULL,
      who VARCHAR(160) NOT NULL,
      what VARCHAR(600) NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      KEY order_events_order (order_id, id),
      CONSTRAINT order_events_order_fk FOREIGN KEY (order_id) REFERENCES orders (id) ON DELETE CASCADE
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await q.query(`CREATE TABLE order_proofs (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      order_id BIGINT UNSIGNED NOT NULL,
      token_hash CHAR(64) NOT NULL,
      status ENUM('open','approved','changes','replaced') NOT NULL DEFAULT 'open',
      sent_to VARCHAR(254) NOT NULL,
      expires_at DATETIME(3) NOT NULL,
      snapshot_json MEDIUMTEXT NOT NULL,
      decided_at DATETIME(3) NULL,
      decided_name VARCHAR(120) NULL,
      decided_address VARCHAR(64) NULL,
      comment TEXT NULL,
      created_by BIGINT UNSIGNED NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      UNIQUE KEY order_proofs_token (token_hash),
      KEY order_proofs_order (order_id),
      CONSTRAINT order_proofs_order_fk FOREIGN KEY (order_id) REFERENCES orders (id) ON DELETE CASCADE
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await q.query(`CREATE TABLE order_payments (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      order_id BIGINT UNSIGNED NOT NULL,
      kind ENUM('deposit','balance','refund') NOT NULL,
      status ENUM('open','paid','refunded','expired') NOT NULL DEFAULT 'open',
      amount_minor INT NOT NULL,
      currency CHAR(3) NOT NULL,
      session_id VARCHAR(255) NULL,
      payment_intent VARCHAR(255) NULL,
      refund_id VARCHAR(255) NULL,
      created_by BIGINT UNSIGNED NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE KEY order_payments_session (session_id),
      KEY order_payments_order (order_id),
      CONSTRAINT order_payments_order_fk FOREIGN KEY (order_id) REFERENCES orders (id) ON DELETE CASCADE
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await q.query(`CREATE TABLE payment_notices (
      event_id VARCHAR(255) NOT NULL PRIMARY KEY,
      type VARCHAR(100) NOT NULL,
      order_id BIGINT UNSIGNED NULL,
      received_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3)
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await q.query('ALTER TABLE sheets ADD COLUMN order_id BIGINT UNSIGNED NULL, ADD KEY sheets_order (order_id)');
    await q.query('ALTER TABLE print_runs ADD COLUMN order_id BIGINT UNSIGNED NULL, ADD KEY print_runs_order (order_id)');
    await q.query(
      "ALTER TABLE shop_settings ADD COLUMN currency_code CHAR(3) NOT NULL DEFAULT 'USD', ADD COLUMN viewers_see_prices BOOLEAN NOT NULL DEFAULT TRUE",
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE shop_settings DROP COLUMN viewers_see_prices, DROP COLUMN currency_code');
    await q.query('ALTER TABLE print_runs DROP KEY print_runs_order, DROP COLUMN order_id');
    await q.query('ALTER TABLE sheets DROP KEY sheets_order, DROP COLUMN order_id');
    for (const table of ['payment_notices', 'order_payments', 'order_proofs', 'order_events', 'order_lines', 'orders', 'customers'])
      await q.query(`DROP TABLE ${table}`);
  }
}
