import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { errorResult, UsageError } from '../../src/cli/errors.js';
import { formatInterval, shortDown, shortUp, table, widthUp } from '../../src/cli/format.js';
import { parseNear, parsePeriod } from '../../src/cli/options.js';
import { SearchOptionError } from '../../src/search/errors.js';
import { CheckerInternalError, checkCertificate } from '../../src/checker/index.js';

const D = Decimal.clone({ precision: 100 });

const decimalString = fc
  .tuple(fc.boolean(), fc.bigInt({ min: 0n, max: 10n ** 40n }), fc.integer({ min: -30, max: 30 }))
  .map(([neg, digits, exp]) => `${neg ? '-' : ''}${digits}e${exp}`);

describe('outward display rounding', () => {
  it('shortDown(x) ≤ x ≤ shortUp(x), with at most `sig` significant digits (property; oracle: decimal.js at 100 digits)', () => {
    fc.assert(
      fc.property(decimalString, fc.integer({ min: 1, max: 20 }), (x, sig) => {
        const lo = shortDown(x, sig);
        const hi = shortUp(x, sig);
        expect(new D(lo).lte(new D(x))).toBe(true);
        expect(new D(x).lte(new D(hi))).toBe(true);
        expect(new D(lo).sd()).toBeLessThanOrEqual(sig);
        expect(new D(hi).sd()).toBeLessThanOrEqual(sig);
      }),
      { numRuns: 500 },
    );
  });

  it('formatInterval never shows a narrower interval; widthUp bounds hi − lo from above (property)', () => {
    fc.assert(
      fc.property(decimalString, decimalString, (a, b) => {
        const [lo, hi] = new D(a).lte(new D(b)) ? [a, b] : [b, a];
        // three shapes: "[a, b]", "0 ± r" (a tiny enclosure of zero, read as [−r, r]) and "0" (exact zero)
        const text = formatInterval([lo, hi], 6);
        const pm = /^0 ± (.*)$/.exec(text);
        const br = /^\[(.*), (.*)\]$/.exec(text);
        const [sLo, sHi] = text === '0' ? ['0', '0'] : pm ? [`-${pm[1]!}`, pm[1]!] : [br![1]!, br![2]!];
        expect(new D(sLo).lte(new D(lo))).toBe(true);
        expect(new D(sHi).gte(new D(hi))).toBe(true);
        expect(new D(widthUp([lo, hi])).gte(new D(hi).minus(lo))).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it('hand-checked values (common practice: round toward −∞ / +∞)', () => {
    expect(shortDown('0.12345678', 4)).toBe('0.1234');
    expect(shortUp('0.12345678', 4)).toBe('0.1235');
    expect(shortDown('-0.12345678', 4)).toBe('-0.1235');
    expect(shortUp('-0.12345678', 4)).toBe('-0.1234');
    expect(shortUp('0.1234', 4)).toBe('0.1234');
  });

  it('table aligns columns and continues multi-line cells', () => {
    expect(table(['a', 'bb'], [['xyz', '1\n2']])).toBe('a    bb\n---  --\nxyz  1\n     2');
  });
});

describe('option parsing', () => {
  it('periods', () => {
    expect(parsePeriod('3')).toBe(3);
    expect(parsePeriod(' 12 ')).toBe(12);
    for (const bad of ['0', '-1', '2.5', '1e3', 'three', '', '100001']) {
      expect(() => parsePeriod(bad), bad).toThrow(UsageError);
    }
  });
  it('--near points', () => {
    expect(parseNear('0.5, -1e-3', 2)).toEqual([0.5, -0.001]);
    expect(() => parseNear('0.5,x', 2)).toThrow(/comma-separated numbers/);
    expect(() => parseNear('NaN')).toThrow(UsageError);
    expect(() => parseNear('1,2,3', 2)).toThrow(/2 state variables but 3 coordinates/);
  });
});

describe('error channels', () => {
  it('user errors exit 2 with their rendering; bugs exit 3 and say so', () => {
    const u = errorResult(new UsageError('bad-period', '--period', 'x', 'nope', 'write e.g. --period 3'));
    expect(u.exitCode).toBe(2);
    expect(u.stderr).toBe('error [bad-period] in --period "x": nope\n  hint: write e.g. --period 3\n');
    const bug = errorResult(new TypeError('cannot read properties of undefined'));
    expect(bug.exitCode).toBe(3);
    expect(bug.stderr).toMatch(/internal error \(this is a bug in orbitseal, not in your input\): TypeError/);
    expect(bug.stderr).not.toMatch(/\n\s+at /);
    // a user error from another layer (a UserError subclass): rendered once, code and hint not repeated
    const searchErr = new SearchOptionError('bad-near', 'near', '[1]', 'expected 2 finite numbers', 'give one number per state variable');
    expect(errorResult(searchErr)).toEqual({
      stdout: '',
      stderr: 'error [bad-near] in near "[1]": expected 2 finite numbers\n  hint: give one number per state variable\n',
      exitCode: 2,
    });
    // only the class counts: an Error that merely carries a user-error name and code is a bug
    const lookalike = Object.assign(new Error('period must be positive'), { name: 'SearchOptionError', code: 'bad-period', hint: 'use 1 or more' });
    expect(errorResult(lookalike).exitCode).toBe(3);
  });
});

describe('the checker reports its own bugs as internal errors, never as a verdict', () => {
  it('an exception inside the checker throws CheckerInternalError (exit 3), not REJECTED', () => {
    // a parsed document whose property access throws: not a property of any certificate text
    const hostile = {
      get format(): string {
        throw new TypeError('boom');
      },
    };
    let thrown: unknown;
    try {
      checkCertificate(hostile);
    } catch (e) {
      thrown = e;
    }
    expect(thrown).toBeInstanceOf(CheckerInternalError);
    expect(errorResult(thrown).exitCode).toBe(3);
    expect(errorResult(thrown).stderr).toMatch(/internal error .*internal checker error \(please report\): TypeError: boom/);
  });
});
