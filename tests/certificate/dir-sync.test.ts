import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { DirectorySync, writeFileAtomic } from '../../src/certificate/write.js';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'orbitseal-dirsync-test-'));
});
afterEach(() => {
  rmSync(dir, { recursive: true, force: true });
});

describe('DirectorySync: one folder fsync per batch', () => {
  it('defers the folder sync of many atomic writes to one flush per folder; files are complete at once', () => {
    const synced: string[] = [];
    const batch = new DirectorySync((d) => synced.push(d));
    const sub = join(dir, 'nested');
    for (let k = 1; k <= 25; k++) writeFileAtomic(join(dir, `c-${k}.json`), `{"k":${k}}\n`, { dirSync: batch });
    writeFileAtomic(join(sub, 'c-1.json'), '{"k":1}\n', { dirSync: batch });
    // every file is whole and visible before the flush; no stray temporary file
    expect(readFileSync(join(dir, 'c-17.json'), 'utf8')).toBe('{"k":17}\n');
    expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
    expect(synced).toEqual([]);
    expect(batch.size).toBe(2);
    batch.flush();
    expect(synced.sort()).toEqual([resolve(dir), resolve(sub)].sort());
    batch.flush(); // nothing left owed
    expect(synced.length).toBe(2);
  });

  it('a write that fails leaves nothing owed for it and no file', () => {
    const batch = new DirectorySync(() => undefined);
    writeFileAtomic(join(dir, 'a.json'), 'x', { dirSync: batch });
    expect(() => writeFileAtomic(join(dir, 'a.json'), 'y', { dirSync: batch })).toThrow(/already exists/);
    expect(readFileSync(join(dir, 'a.json'), 'utf8')).toBe('x');
    expect(batch.size).toBe(1);
  });
});
