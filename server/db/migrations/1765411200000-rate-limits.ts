import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Counters for rate limits (sign-in failures, sign-ups, reset and invite e-mails), kept in the
 * database so every app process sees the same counts. The columns are the ones
 * rate-limiter-flexible's MySQL store reads and writes.
 */
export class RateLimits1765411200000 implements MigrationInterface {
  name = 'RateLimits1765411200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE rate_limits (
        \`key\` VARCHAR(255) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        points INT NOT NULL DEFAULT 0,
        expire BIGINT UNSIGNED NULL,
        PRIMARY KEY (\`key\`),
        KEY ix_rate_limits_expire (expire)
      ) ENGINE = InnoDB`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE rate_limits');
  }
}
