/**
 * The checker on box-graph count certificates (kind "periodic-orbit-count-box-graph"): a genuine
 * one is VERIFIED; tampered ones are REJECTED (drop a box, drop an edge, drop an orbit, change
 * the count, cut a path's code), each re-signed so that the hash is not what rejects them.
 * Check values: Hénon a = 1.4, b = 0.3 in [-2, 2]^2, orbits of minimal period 1..4: 2, 1, 0, 1
 * (Z. Galias 2001, "Interval methods for rigorous investigations of periodic orbits", Int. J.
 * Bifurcation and Chaos 11(9), values from memory of its table; they agree with an independent
 * float search made here, `orbitseal find henon --period p`, p = 1..4: 2, 1, 0, 1 candidates).
 */
import { describe, expect, it } from 'vitest';
import { certificateHash } from '../../src/certificate/canonical.js';
import type { BoxGraphCountCertificateV1 } from '../../src/certificate/types.js';
import { checkCertificate } from '../../src/checker/index.js';
import { compileMap, getCatalogueMap } from '../../src/model/index.js';
import { countOrbits } from '../../src/workflow/count.js';

function resign(c: BoxGraphCountCertificateV1): BoxGraphCountCertificateV1 {
  const { sha256, ...rest } = c;
  void sha256;
  return { ...rest, sha256: certificateHash(rest) } as BoxGraphCountCertificateV1;
}

describe('checker: box-graph count certificates', () => {
  it('verifies a genuine certificate and rejects tampered ones', async () => {
    const henon = compileMap(getCatalogueMap('henon')!);
    const rep = await countOrbits({ map: henon, periods: [1, 2, 3, 4], region: [['-2', '2'], ['-2', '2']], level: 5, maxLevel: 8, check: false });
    const cert = rep.certificate as BoxGraphCountCertificateV1;
    expect(cert.kind).toBe('periodic-orbit-count-box-graph');
    expect(cert.counts.map((e) => e.claims.orbitsByMinimalPeriod[String(e.period)])).toEqual([2, 1, 0, 1]); // Galias 2001, from memory
    expect(checkCertificate(JSON.stringify(cert)).verdict).toBe('VERIFIED');
    const clone = (): BoxGraphCountCertificateV1 => JSON.parse(JSON.stringify(cert)) as BoxGraphCountCertificateV1;

    // drop a box: a cell of the invariant part removed (with its edges, indices renumbered)
    const dropBox = clone();
    const g4 = dropBox.counts.find((e) => e.period === 4)!.graph;
    const i = Math.floor(g4.cells.length / 2);
    g4.cells.splice(i, 1);
    g4.successors.splice(i, 1);
    g4.successors = g4.successors.map((l) => l.filter((t) => t !== i).map((t) => (t > i ? t - 1 : t)));
    const r1 = checkCertificate(resign(dropBox));
    expect(r1.verdict).toBe('REJECTED');
    expect(r1.reason).toMatch(/box is missing/);

    // drop an edge
    const dropEdge = clone();
    const e4g = dropEdge.counts.find((e) => e.period === 4)!.graph;
    const j = e4g.successors.findIndex((l) => l.length > 1);
    e4g.successors[j]!.pop();
    const r2 = checkCertificate(resign(dropEdge));
    expect(r2.verdict).toBe('REJECTED');
    expect(r2.reason).toMatch(/edge is missing/);

    // drop an orbit: the leaf holding the period-4 orbit's zero marked undecided
    const dropOrbit = clone();
    const e4 = dropOrbit.counts.find((e) => e.period === 4)!;
    e4.code = e4.code.replace('*', '?');
    const r3 = checkCertificate(resign(dropOrbit));
    expect(r3.verdict).toBe('REJECTED');
    expect(r3.reason).toMatch(/claimed (zeros|undecidedBoxes)/);

    // change the count
    const more = clone();
    more.counts.find((e) => e.period === 4)!.claims.orbitsByMinimalPeriod['4'] = 2;
    const r4 = checkCertificate(resign(more));
    expect(r4.verdict).toBe('REJECTED');
    expect(r4.reason).toMatch(/minimal period 4/);

    // a closed path without its code (the codes end early)
    const cut = clone();
    const e3 = cut.counts.find((e) => e.period === 3)!;
    e3.code = e3.code.slice(0, -1);
    const r5 = checkCertificate(resign(cut));
    expect(r5.verdict).toBe('REJECTED');
    expect(r5.reason).toMatch(/ends early/);

    // the number of closed paths misstated
    const paths = clone();
    paths.counts[0]!.cycles += 1;
    expect(checkCertificate(resign(paths)).reason).toMatch(/closed paths/);
  }, 60_000);
});
