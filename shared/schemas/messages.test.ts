import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import * as auth from './auth';
import * as exportsSchemas from './exports';
import * as library from './library';
import * as outline from './outline';
import * as sheets from './sheets';
import * as shop from './shop';
import * as team from './team';

// The library's own wording ("Invalid input: expected number, received NaN", "Too big: expected
// number to be <=10000000") must never reach a maker: every field of every shared form schema is fed
// the wrong things a person types, and each refusal has to read as ours.
const RAW = /invalid input|expected|received|nan\b|too (big|small)|invalid option|invalid string|<=|>=/i;
const WRONG = ['abc', '', '12abc', -1e12, 1e12, 1.5, {}, []];

const objects = Object.entries({ ...auth, ...exportsSchemas, ...library, ...outline, ...sheets, ...shop, ...team }).filter(
  ([, value]) => value instanceof z.ZodObject,
) as Array<[string, z.ZodObject]>;

describe('form schemas refuse in a maker’s words', () => {
  it('finds the schemas to check', () => {
    expect(objects.length).toBeGreaterThan(20);
  });

  for (const [name, schema] of objects) {
    it(name, () => {
      const raw: string[] = [];
      for (const [key, field] of Object.entries(schema.shape)) {
        for (const value of WRONG) {
          const parsed = (field as z.ZodType).safeParse(value);
          if (parsed.success) continue;
          for (const issue of parsed.error.issues)
            if (RAW.test(issue.message)) raw.push(`${key} = ${JSON.stringify(value)}: ${issue.message}`);
        }
      }
      expect([...new Set(raw)]).toEqual([]);
    });
  }

  it('Units allowed: abc says to give a whole number of units', () => {
    const parsed = library.licenceSchema.safeParse({ kind: 'commercial_limited', source: '', notes: '', unitLimit: 'abc' });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.message)).toEqual(['Units allowed: give a whole number, like 500']);
  });
});
