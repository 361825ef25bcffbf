/**
 * The checker on count certificates: a genuine one is VERIFIED; tampered ones are REJECTED (drop a
 * box, drop an orbit, change the count, remove a piece, break the hash).
 * Check values: logistic r = 4, p = 3: 2 orbits of minimal period 3 and 2 fixed points (OEIS
 * A001037: 2, 1, 2).
 */
import { describe, expect, it } from 'vitest';
import { certificateHash } from '../../src/certificate/canonical.js';
import type { CountCertificateV1 } from '../../src/certificate/types.js';
import { checkCertificate } from '../../src/checker/index.js';
import { compileMap, getCatalogueMap } from '../../src/model/index.js';
import { countOrbits } from '../../src/workflow/count.js';

async function genuine(): Promise<CountCertificateV1> {
  const map = compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: '4' } });
  const rep = await countOrbits({ map, periods: [3], pieceDepth: 1, check: false });
  return rep.certificate as CountCertificateV1;
}

function resign(c: CountCertificateV1): CountCertificateV1 {
  const { sha256, ...rest } = c;
  void sha256;
  return { ...rest, sha256: certificateHash(rest) } as CountCertificateV1;
}

describe('checker: count certificates', () => {
  it('verifies a genuine certificate and tells tampered ones apart', async () => {
    const cert = await genuine();
    expect(cert.counts[0]!.claims.orbitsByMinimalPeriod).toEqual({ '1': 2, '3': 2 }); // A001037
    expect(checkCertificate(JSON.stringify(cert)).verdict).toBe('VERIFIED');

    const clone = (): CountCertificateV1 => JSON.parse(JSON.stringify(cert)) as CountCertificateV1;

    // change the count
    const more = clone();
    more.counts[0]!.claims.orbitsByMinimalPeriod['3'] = 3;
    const r1 = checkCertificate(resign(more));
    expect(r1.verdict).toBe('REJECTED');
    expect(r1.reason).toMatch(/minimal period 3/);

    // drop a box: cut the last leaf of a piece
    const dropBox = clone();
    dropBox.counts[0]!.pieces[1] = dropBox.counts[0]!.pieces[1]!.slice(0, -1);
    const r2 = checkCertificate(resign(dropBox));
    expect(r2.verdict).toBe('REJECTED');
    expect(r2.reason).toMatch(/ends early|box is missing/);

    // drop an orbit: a leaf holding a zero marked undecided → the counts no longer follow
    const dropOrbit = clone();
    const piece = dropOrbit.counts[0]!.pieces.findIndex((c) => c.includes('*'));
    dropOrbit.counts[0]!.pieces[piece] = dropOrbit.counts[0]!.pieces[piece]!.replace('*', '?');
    const r3 = checkCertificate(resign(dropOrbit));
    expect(r3.verdict).toBe('REJECTED');
    expect(r3.reason).toMatch(/claimed (zeros|undecidedBoxes)/);

    // a missing piece (incomplete cover)
    const fewer = clone();
    fewer.counts[0]!.pieces.pop();
    expect(checkCertificate(resign(fewer)).reason).toMatch(/incomplete cover/);

    // a split that does not exist (component 7 in a 3-dimensional shooting system)
    const badSplit = clone();
    badSplit.counts[0]!.pieces[0] = 'H' + badSplit.counts[0]!.pieces[0]!;
    expect(checkCertificate(resign(badSplit)).verdict).toBe('REJECTED');

    // an unknown key a person could read as a claim (the schema forbids it; common practice, no source)
    const noted = clone() as CountCertificateV1 & { note?: string };
    noted.note = 'every orbit of every period';
    expect(checkCertificate(resign(noted)).reason).toMatch(/unknown key "note"/);

    // any edit without a new hash
    const unsigned = clone();
    unsigned.counts[0]!.claims.zeros = 9;
    expect(checkCertificate(unsigned).path).toBe('$.sha256');
  }, 30_000);

  it('rejects a box marked excluded that holds a zero', async () => {
    // logistic r = 4, p = 1 with no pieces: the whole tree in one code; mark every leaf '-'
    const map = compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: '4' } });
    const rep = await countOrbits({ map, periods: [1], pieceDepth: 0, check: false });
    const c = JSON.parse(JSON.stringify(rep.certificate)) as CountCertificateV1;
    c.counts[0]!.claims = { zeros: 0, orbitsByMinimalPeriod: { '1': 0 }, undecidedBoxes: 0, undecidedZeros: 0 };
    c.counts[0]!.pieces[0] = '-';
    const r = checkCertificate(resign(c));
    expect(r.verdict).toBe('REJECTED');
    expect(r.reason).toMatch(/neither excluded nor shown/);
  }, 30_000);
});
