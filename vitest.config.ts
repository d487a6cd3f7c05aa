import { defineConfig } from 'vitest/config';
import { aliases } from './vite.config.ts';

export default defineConfig({
  resolve: { alias: aliases },
  test: {
    include: ['shared/**/*.test.ts', 'src/**/*.test.ts', 'server/**/*.test.ts', 'tests/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['tests/setup/global-setup.ts'],
    testTimeout: 30_000,
    hookTimeout: 90_000,
    pool: 'forks',
    maxWorkers: 2,
    reporters: ['default'],
  },
});
