import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Marks what the demo seeder created with a stable key (never a display name), and gives every
 * user a session epoch: sessions remember the epoch they began in, and a password change, a reset
 * or "sign out everywhere" moves it on, ending every session from before.
 */
export class DemoMarkersAndSessions1765324800000 implements MigrationInterface {
  name = 'DemoMarkersAndSessions1765324800000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      ALTER TABLE users
        ADD COLUMN seed_key VARCHAR(40) NULL,
        ADD COLUMN session_epoch INT UNSIGNED NOT NULL DEFAULT 0,
        ADD UNIQUE KEY uq_users_seed_key (seed_key)`);
    await queryRunner.query('ALTER TABLE teams ADD COLUMN seed_key VARCHAR(40) NULL, ADD UNIQUE KEY uq_teams_seed_key (seed_key)');
    // Installs seeded before this migration: the demo accounts live under the reserved .test
    // domain (RFC 2606), so no real person has them. The demo team is the oldest team of that
    // name whose members are all demo accounts: a team someone renamed to it keeps its owner.
    await queryRunner.query(`
      UPDATE users SET seed_key = CONCAT('demo:', SUBSTRING_INDEX(email, '@', 1))
      WHERE email IN ('owner@demo.test', 'admin@demo.test', 'member@demo.test', 'viewer@demo.test')`);
    await queryRunner.query(`
      UPDATE teams t JOIN (
        SELECT MIN(t2.id) AS id FROM teams t2
        WHERE t2.name = 'Puddlejump Paper Co.' AND t2.personal = 0
          AND NOT EXISTS (SELECT 1 FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.team_id = t2.id AND u.seed_key IS NULL)
      ) demo ON demo.id = t.id
      SET t.seed_key = 'demo:shop'`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE teams DROP KEY uq_teams_seed_key, DROP COLUMN seed_key');
    await queryRunner.query('ALTER TABLE users DROP KEY uq_users_seed_key, DROP COLUMN seed_key, DROP COLUMN session_epoch');
  }
}
