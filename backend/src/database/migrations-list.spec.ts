import { readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { MIGRATIONS } from '../../migrations';

// The compiled server and the tests apply the hand-kept list in backend/migrations/index.ts. These checks
// keep it honest: every file on disk is listed once, and the list runs in timestamp order, so a database
// migrated step by step over several releases ends up where a fresh one does.
describe('the migration list', () => {
  const names = MIGRATIONS.map(([name]) => name);

  it('lists every migration file on disk exactly once', () => {
    const dir = path.resolve(__dirname, '../../migrations');
    const files = readdirSync(dir)
      .filter((f) => /^\d{14}_.+\.ts$/.test(f))
      .map((f) => f.replace(/\.ts$/, ''))
      .sort();
    expect([...names].sort()).toEqual(files);
    expect(new Set(names).size).toBe(names.length);
  });

  it('is in timestamp order', () => {
    expect(names).toEqual([...names].sort());
  });
});
