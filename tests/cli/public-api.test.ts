import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import * as orbitseal from '../../src/index.js';

describe('public API (src/index.ts)', () => {
  it('exposes every layer and the one-call workflow; the workflow proves the logistic fixed point 1 − 1/r', async () => {
    for (const name of ['resolveMap', 'compileMap', 'findCandidates', 'proveOrbit', 'buildCertificate', 'writeCertificate', 'checkPaths', 'certifyOrbits', 'runCli'] as const) {
      expect(typeof orbitseal[name], name).toBe('function');
    }
    const dir = mkdtempSync(join(tmpdir(), 'orbitseal-api-test-'));
    try {
      const def = orbitseal.resolveMap('logistic');
      const overrides = { r: { kind: 'exact', value: '2.5' } } as const;
      const map = orbitseal.compileMap(def, overrides);
      const report = await orbitseal.certifyOrbits(def, map, { period: 1, near: [0.6], outDir: dir, overrides });
      expect(report.allProven).toBe(true);
      const o = report.outcomes[0]!;
      expect(o.status).toBe('verified');
      // 1 − 1/r = 0.6 for r = 2.5 (closed form, derived by hand)
      const [lo, hi] = o.orbit!.boxes[0]![0]!;
      expect(Number(lo) <= 0.6 && 0.6 <= Number(hi)).toBe(true);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
