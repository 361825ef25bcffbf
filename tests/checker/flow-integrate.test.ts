/**
 * The checker's integrator (src/checker/flow.ts `flowImage`) against closed forms at random
 * starts, times and (random, possibly bad) hints: whatever the hints, the result either contains
 * the exact image and derivative (decimal.js at 60 digits) or is refused — never wrong.
 */
import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { ivCtx } from '../../src/checker/elementary.js';
import { flowImage, type FlowRead } from '../../src/checker/flow.js';
import { parseFormula } from '../../src/checker/formula.js';
import { DomainViolation, type Iv } from '../../src/checker/interval.js';

const H = Decimal.clone({ precision: 60 });
const c = ivCtx(30);
const inIv = (v: Iv, x: Decimal): boolean => x.gte(v.lo.toString()) && x.lte(v.hi.toString());
class Refused extends Error {}
const reject = (_path: string, msg: string): never => {
  throw new Refused(msg);
};

/** A plan: `k` steps of `h` (as text) then the last step to the duration; frames as given. */
function plan(k: number, h: string, n: number, frames: (string[][] | null)[]): FlowRead['plans'][number] {
  const box = Array.from({ length: n }, (): [string, string] => ['0', '0']);
  const steps = [];
  for (let j = 0; j <= k; j++) steps.push({ h: j < k ? h : null, apriori: box, frame: frames[j % frames.length] ?? null });
  return steps;
}

describe('checker flow integration against closed forms (fast-check)', () => {
  it("x' = a·x: φ(T, x0) = x0·e^{aT}, Dφ = e^{aT} (closed form)", () => {
    fc.assert(
      fc.property(fc.integer({ min: -2000, max: 1000 }), fc.integer({ min: -3000, max: 3000 }), fc.integer({ min: 300, max: 2000 }), (am, xm, tm) => {
        const a = new H(am).div(1000);
        const x0 = new H(xm).div(1000);
        const T = new H(tm).div(1000);
        const params = new Map([['a', c.literal(a.toString())]]);
        const fr: FlowRead = {
          rhs: [parseFormula('a*x', ['x'], new Set(['a']))], hasTime: false, duration: parseFormula(T.toString(), [], new Set()), order: 12,
          plans: [plan(4, T.div(5).toSD(6).toString(), 1, [null])], rhsOps: 3,
        };
        const r = flowImage(fr, c, params, 1, reject)([c.literal(x0.toString())], true, 0);
        const e = H.exp(a.times(T));
        return inIv(r.f[0]!, x0.times(e)) && inIv(r.jac![0]!, e);
      }),
      { numRuns: 12 },
    );
  });

  it("rotation x' = y, y' = −x with random frame hints: contains (cos, −sin) images or refuses", () => {
    let verified = 0;
    fc.assert(
      fc.property(
        fc.integer({ min: 500, max: 3000 }),
        fc.array(fc.array(fc.integer({ min: -9, max: 9 }), { minLength: 4, maxLength: 4 }), { minLength: 1, maxLength: 3 }),
        (tm, mats) => {
          const T = new H(tm).div(1000);
          const frames = mats.map((m) => [[String(m[0]), String(m[1])], [String(m[2]), String(m[3])]]);
          const fr: FlowRead = {
            rhs: [parseFormula('y', ['x', 'y'], new Set()), parseFormula('-x', ['x', 'y'], new Set())], hasTime: false,
            duration: parseFormula(T.toString(), [], new Set()), order: 14, plans: [plan(4, T.div(6).toSD(6).toString(), 2, frames)], rhsOps: 3,
          };
          const box = [c.literal('0.9', '1.1'), c.literal('-0.1', '0.1')];
          let r;
          try {
            r = flowImage(fr, c, new Map(), 2, reject)(box, true, 0);
          } catch (e) {
            if (e instanceof Refused || e instanceof DomainViolation) return true; // refused: allowed
            throw e;
          }
          verified++;
          // φ(T, (x, y)) = (x cos T + y sin T, −x sin T + y cos T): check the four corners and the
          // Jacobian [[cos, sin], [−sin, cos]] (closed form)
          const co = H.cos(T);
          const si = H.sin(T);
          for (const x of ['0.9', '1.1']) {
            for (const y of ['-0.1', '0.1']) {
              if (!inIv(r.f[0]!, new H(x).times(co).plus(new H(y).times(si)))) return false;
              if (!inIv(r.f[1]!, new H(x).times(si).neg().plus(new H(y).times(co)))) return false;
            }
          }
          return inIv(r.jac![0]!, co) && inIv(r.jac![1]!, si) && inIv(r.jac![2]!, si.neg()) && inIv(r.jac![3]!, co);
        },
      ),
      { numRuns: 12 },
    );
    expect(verified).toBeGreaterThan(0); // the property ran on real enclosures, not only refusals
  });
});
