import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { buildCertificate } from '../../src/certificate/build.js';
import { hasValidHash } from '../../src/certificate/canonical.js';
import {
  certificateFileName,
  CertificateWriteError,
  mapSlug,
  writeCertificate,
} from '../../src/certificate/write.js';
import { logisticDef, logisticFixedPoint } from './fixtures.js';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'orbitseal-write-test-'));
});
afterEach(() => {
  rmSync(dir, { recursive: true, force: true });
});

describe('file names', () => {
  it('slugs titles (common practice, no source)', () => {
    expect(mapSlug('Hénon map (classic)')).toBe('henon-map-classic');
    expect(mapSlug('  ***  ')).toBe('map');
    expect(certificateFileName('Orchard moth census', 3, 2)).toBe('orchard-moth-census-p3-2.json');
  });
});

describe('writeCertificate', () => {
  const cert = buildCertificate(logisticFixedPoint, logisticDef);

  it('writes the whole document, leaves no temp file, and round-trips with a valid hash', () => {
    const path = writeCertificate(join(dir, 'sub', 'a.json'), cert);
    expect(readdirSync(join(dir, 'sub'))).toEqual(['a.json']);
    const back = JSON.parse(readFileSync(path, 'utf8'));
    expect(back).toEqual(cert);
    expect(hasValidHash(back)).toBe(true);
  });

  it('never overwrites without force, and says how to fix it', () => {
    const path = join(dir, 'a.json');
    writeFileSync(path, 'precious');
    let err: unknown;
    try {
      writeCertificate(path, cert);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(CertificateWriteError);
    expect((err as CertificateWriteError).code).toBe('cert-exists');
    expect((err as CertificateWriteError).render()).toMatch(/a\.json.*already exists[\s\S]*--force/);
    expect(readFileSync(path, 'utf8')).toBe('precious');
    expect(readdirSync(dir)).toEqual(['a.json']);
  });

  it('replaces with force', () => {
    const path = join(dir, 'a.json');
    writeFileSync(path, 'old');
    writeCertificate(path, cert, { force: true });
    expect(JSON.parse(readFileSync(path, 'utf8'))).toEqual(cert);
    expect(readdirSync(dir)).toEqual(['a.json']);
  });

  it('reports an unwritable place as cert-write-failed', () => {
    const blocker = join(dir, 'file');
    writeFileSync(blocker, 'x');
    expect(() => writeCertificate(join(blocker, 'a.json'), cert)).toThrow(
      expect.objectContaining({ code: 'cert-write-failed' }),
    );
    expect(existsSync(join(blocker, 'a.json'))).toBe(false);
  });
});
