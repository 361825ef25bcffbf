import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { checkCertificate } from '../../src/checker/index.js';
import { D60, logistic4Primitive, logistic4Orbit, makeCert, s40, seal, widen } from './certs.js';

type Doc = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
const H = Decimal.clone({ precision: 400 });

/** Base certificates from closed forms (derived by hand; Hénon 1976, Commun. Math. Phys. 50). */
const baseArb: fc.Arbitrary<Doc> = fc.oneof(
  fc.integer({ min: 100, max: 900 }).map((i) => {
    const rs = new D60(3).plus(new D60(i).div(1000)).toString();
    const r = new D60(rs);
    return makeCert({
      state: ['x'], params: { r: rs }, step: { x: 'r*x*(1 - x)' }, centre: [[s40(new D60(1).minus(new D60(1).div(r)))]],
      rad: '1e-20', uniquenessRadius: '1e-3', stability: { class: 'repelling', multiplier: widen(new D60(2).minus(r), '1e-12') },
    });
  }),
  fc.integer({ min: 100, max: 900 }).map((i) => {
    const rs = new D60(3).plus(new D60(i).div(1000)).toString();
    const r = new D60(rs);
    const root = r.minus(3).times(r.plus(1)).sqrt();
    const mult = new D60(4).plus(r.times(2)).minus(r.times(r));
    return makeCert({
      state: ['x'], params: { r: rs }, step: { x: 'r*(1 - x)*x' },
      centre: [[s40(r.plus(1).plus(root).div(r.times(2)))], [s40(r.plus(1).minus(root).div(r.times(2)))]],
      rad: '1e-20', stability: { class: mult.abs().lt(1) ? 'attracting' : 'repelling', multiplier: widen(mult, '1e-12') },
    });
  }),
  fc.record({ p: fc.integer({ min: 3, max: 8 }), k: fc.bigInt({ min: 1n, max: 250n }) }).map(({ p, k }) => {
    const m = (1n << BigInt(p)) - 1n;
    let kk = (k % (m - 1n)) + 1n;
    while (!logistic4Primitive(p, kk)) kk = (kk % (m - 1n)) + 1n;
    return makeCert({
      state: ['x'], params: { r: '4' }, step: { x: '4*x - r*x^2' }, centre: logistic4Orbit(p, kk), rad: '1e-22',
      uniquenessRadius: '1e-21', stability: { class: 'repelling', multiplier: widen(new D60(2).pow(p), '1e-12') },
    });
  }),
  fc.record({ a: fc.integer({ min: 100, max: 140 }), b: fc.integer({ min: 20, max: 40 }), sign: fc.constantFrom(1, -1) }).map(({ a: ai, b: bi, sign }) => {
    const a = new D60(ai).div(100);
    const b = new D60(bi).div(100);
    const one = new D60(1);
    const x = one.minus(b).neg().plus(one.minus(b).pow(2).plus(a.times(4)).sqrt().times(sign)).div(a.times(2));
    return makeCert({
      state: ['x', 'y'], params: { a: a.toString(), b: b.toString() }, step: { x: '1 - a*x^2 + y', y: 'b*x' },
      centre: [[s40(x), s40(x.times(b))]], rad: '1e-20', uniquenessRadius: '1e-4',
      stability: { class: 'saddle', determinant: widen(b.neg(), '1e-12') },
    });
  }),
);

const KINDS = ['move-endpoint', 'shrink-box', 'parameter-digit', 'formula-char', 'period', 'stability-class', 'minimal-period', 'uniqueness-radius', 'stability-enclosure'] as const;
type Kind = (typeof KINDS)[number];

/** Apply one mutation; returns false when it does not apply to this certificate. */
function mutate(doc: Doc, kind: Kind, pick: number): boolean {
  const p: number = doc.period;
  const n: number = doc.map.state.length;
  const i = pick % p;
  const a = Math.floor(pick / p) % n;
  const x = new H(doc.orbit.centre[i][a]);
  const box = doc.orbit.boxes[i][a];
  const rad = new H(box[1]).minus(box[0]).div(2);
  switch (kind) {
    case 'move-endpoint': // the box moves off the orbit point (centre kept inside the box)
      doc.orbit.boxes[i][a] = [x.plus(rad.times(2)).toString(), x.plus(rad.times(3)).toString()];
      doc.orbit.centre[i][a] = x.plus(rad.times(2.5)).toString();
      return true;
    case 'shrink-box': // the upper end drops below the true point
      doc.orbit.boxes[i][a] = [box[0], x.minus(rad.div(2)).toString()];
      doc.orbit.centre[i][a] = x.minus(rad.times(0.75)).toString();
      return true;
    case 'parameter-digit': {
      const names = Object.keys(doc.map.params);
      const k = names[pick % names.length]!;
      const v: string = doc.map.params[k];
      const last = Number(v[v.length - 1]);
      doc.map.params[k] = v.slice(0, -1) + String((last + 1) % 10);
      return true;
    }
    case 'formula-char': {
      const key = doc.map.state[a];
      const f: string = doc.map.step[key];
      const spots = [...f].map((ch, j) => ({ ch, j })).filter(({ ch }) => /[-+*/\d^]/.test(ch));
      const { ch, j } = spots[pick % spots.length]!;
      const swap: Record<string, string> = { '-': '+', '+': '-', '*': '/', '/': '*', '^': '*' };
      const to = /\d/.test(ch) ? String((Number(ch) + 1) % 10) : swap[ch]!;
      doc.map.step[key] = f.slice(0, j) + to + f.slice(j + 1);
      return true;
    }
    case 'period':
      doc.period = pick % 2 === 0 ? p + 1 : p === 1 ? 1_000_000_000 : p - 1;
      return true;
    case 'stability-class': {
      const now = doc.claims.stability.class;
      doc.claims.stability.class = now === 'attracting' ? 'repelling' : 'attracting';
      return true;
    }
    case 'minimal-period':
      if (p === 1) return false;
      doc.claims.minimalPeriod = pick % 2 === 0 ? 1 : p - 1;
      return true;
    case 'uniqueness-radius':
      if (!doc.claims.uniqueness) return false;
      doc.claims.uniqueness = { radius: '3' }; // false claim: Y then also holds another fixed point (another zero)
      return true;
    case 'stability-enclosure': {
      const st = doc.claims.stability;
      const key = st.multiplier ? 'multiplier' : st.determinant ? 'determinant' : null;
      if (!key) return false;
      const [lo, hi] = st[key];
      st[key] = pick % 2 === 0 ? [new H(hi).plus(1e-30).toString(), new H(hi).plus(1).toString()] : [new H(lo).minus(1).toString(), new H(lo).minus(1e-30).toString()];
      return true;
    }
  }
}

describe('tampered certificates are REJECTED', () => {
  it('every base certificate verifies before tampering', () => {
    fc.assert(fc.property(baseArb, (doc) => checkCertificate(doc).verdict === 'VERIFIED'), { numRuns: 25 });
  });

  it('re-hashed mutants are caught by the mathematics (not the hash), never crash, never verify', () => {
    const tried: Record<string, number> = {};
    const caught: Record<string, number> = {};
    fc.assert(
      fc.property(baseArb, fc.constantFrom(...KINDS), fc.nat(1000), (base, kind, pick) => {
        const doc = structuredClone(base);
        if (!mutate(doc, kind, pick)) return true;
        seal(doc);
        tried[kind] = (tried[kind] ?? 0) + 1;
        const rep = checkCertificate(JSON.stringify(doc));
        if (rep.verdict === 'REJECTED' && !/sha256|internal/.test(rep.reason ?? '')) caught[kind] = (caught[kind] ?? 0) + 1;
        return rep.verdict === 'REJECTED' && !/sha256|internal/.test(rep.reason ?? '');
      }),
      { numRuns: 180 },
    );
    const total = Object.values(tried).reduce((s, v) => s + v, 0);
    const totalCaught = Object.values(caught).reduce((s, v) => s + v, 0);
    console.log(`tamper (re-hashed): ${totalCaught}/${total} mutants caught`, JSON.stringify({ tried, caught }));
    expect(totalCaught).toBe(total);
    expect(Object.keys(tried).length).toBe(KINDS.length);
  });

  it('mutants without re-hashing are caught by the hash', () => {
    let tried = 0;
    let caught = 0;
    fc.assert(
      fc.property(baseArb, fc.constantFrom(...KINDS.filter((k) => k !== 'period')), fc.nat(1000), (base, kind, pick) => {
        const doc = structuredClone(base);
        if (!mutate(doc, kind, pick)) return true;
        tried++;
        const rep = checkCertificate(doc);
        const ok = rep.verdict === 'REJECTED' && rep.path === '$.sha256';
        if (ok) caught++;
        return ok;
      }),
      { numRuns: 60 },
    );
    console.log(`tamper (not re-hashed): ${caught}/${tried} mutants caught by the hash`);
    expect(caught).toBe(tried);
  });
});
