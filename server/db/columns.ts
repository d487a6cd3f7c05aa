// Column options shared by entities: MariaDB's DECIMAL comes back from mysql2 as a string, and
// TINYINT(1) as 0/1; these read them as the numbers and booleans the code means.
import type { ColumnOptions } from 'typeorm';

/** A DECIMAL(precision, scale) read as a number. */
export const decimal = (precision: number, scale: number, extra: ColumnOptions = {}): ColumnOptions => ({
  type: 'decimal',
  precision,
  scale,
  transformer: { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) },
  ...extra,
});

/** A DATE read and written as its ISO day ("2026-12-05"), never shifted by a time zone. */
export const day = (extra: ColumnOptions = {}): ColumnOptions => ({
  type: 'date',
  transformer: {
    to: (v: string | null) => v,
    from: (v: string | Date | null) => (v === null ? null : typeof v === 'string' ? v.slice(0, 10) : v.toISOString().slice(0, 10)),
  },
  ...extra,
});
