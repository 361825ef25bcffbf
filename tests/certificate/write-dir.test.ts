// Check values here are invented demo/test data and its exact round trip (what goes in must come
// out unchanged); no outside reference value is involved.
/** Creating the output folder without mkdirSync(recursive) (it loops forever under /proc on Linux). */
import { existsSync, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { CertificateWriteError, checkDirectoryUsable, describeFsError, ensureDirectory, writeFileAtomic } from '../../src/certificate/write.js';

const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-write-dir-test-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

describe('ensureDirectory / checkDirectoryUsable', () => {
  it('creates three missing levels one by one', () => {
    const deep = join(scratch, 'a', 'b', 'c');
    ensureDirectory(deep);
    expect(statSync(deep).isDirectory()).toBe(true);
    ensureDirectory(deep); // existing: no error
    expect(writeFileAtomic(join(scratch, 'x', 'y', 'f.txt'), 'hi\n')).toBe(join(scratch, 'x', 'y', 'f.txt'));
  });

  it('a file in the way → cert-write-failed naming it, nothing created', () => {
    const file = join(scratch, 'plain.txt');
    writeFileSync(file, 'x');
    let err: unknown;
    try {
      checkDirectoryUsable(join(file, 'sub', 'dir'));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(CertificateWriteError);
    expect((err as CertificateWriteError).code).toBe('cert-write-failed');
    expect((err as CertificateWriteError).message).toBe(`${file} exists and is not a folder`);
  });

  it.skipIf(!existsSync('/proc/self'))('/proc/nope fails at once with the system reason (regression: mkdirSync recursive hung)', () => {
    const t0 = performance.now();
    let err: unknown;
    try {
      writeFileAtomic('/proc/nope/f.json', '{}\n');
    } catch (e) {
      err = e;
    }
    expect(performance.now() - t0).toBeLessThan(2000);
    expect(err).toBeInstanceOf(CertificateWriteError);
    const msg = (err as CertificateWriteError).render();
    expect(msg).toMatch(/^\/proc\/nope: error \[cert-write-failed\]: cannot create folder \/proc\/nope: E[A-Z]+ \(/);
    expect(msg).not.toMatch(/(E[A-Z]+): \1/);
  });
});

describe('describeFsError', () => {
  it('does not repeat the code node already puts in the message (trial: "EPERM: EPERM: …")', () => {
    const e = Object.assign(new Error("EPERM: operation not permitted, open '/x/y'"), { code: 'EPERM' });
    expect(describeFsError(e)).toBe('EPERM (operation not permitted)');
    const r = Object.assign(new Error("EXDEV: cross-device link not permitted, rename '/a' -> '/b'"), { code: 'EXDEV' });
    expect(describeFsError(r)).toBe('EXDEV (cross-device link not permitted)');
    expect(describeFsError(new Error('plain'))).toBe('plain');
  });
});
