// Terminal-aware output: tables fitted to 80 and 120 columns (snapshots), numbers never cut,
// compact outward-rounded numbers. Check values: closed forms derived by hand (noted), decimal.js
// at 100 digits as the oracle of the properties, and the committed certificates in proofs/.
import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { fitText, formatInterval, formatModulus, table, terminalWidth, wrapLine } from '../../src/cli/format.js';
import { renderCheck } from '../../src/cli/commands/check.js';
import { renderProve } from '../../src/cli/commands/prove.js';
import { runCli } from '../../src/cli/program.js';
import { checkPaths } from '../../src/checker/index.js';
import { certifyOrbits } from '../../src/workflow/certify.js';
import { compileMap, getCatalogueMap } from '../../src/model/index.js';

const D = Decimal.clone({ precision: 100 });
const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const work = mkdtempSync(join(tmpdir(), 'orbitseal-layout-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const longest = (text: string) => Math.max(...text.split('\n').map((l) => [...l].length));

describe('numbers for people', () => {
  it('large and tiny ends use a compact scientific form, rounded outward (values from the issue)', () => {
    expect(formatInterval(['-1126007200000000', '-1126007100000000'], 8)).toBe('[-1.1260072e15, -1.1260071e15]');
    expect(formatInterval(['96979804000000000', '96979805000000001'], 8)).toBe('[9.6979804e16, 9.6979806e16]');
    expect(formatInterval(['0.000000012345', '0.000000012346'], 3)).toBe('[1.23e-8, 1.24e-8]');
  });

  it('a modulus never shows a negative lower end; a tiny box around 0 reads "0 ± r"', () => {
    expect(formatModulus(['-1e-300', '4.5e-300'])).toBe('[0, 4.5e-300]');
    expect(formatModulus(['0.5', '0.6'])).toBe('[0.5, 0.6]');
    expect(formatInterval(['-1.00000000001e-300', '1.00000000001e-300'])).toBe('0 ± 1.1e-300');
    expect(formatInterval(['0', '0'])).toBe('0');
    expect(formatInterval(['-0.25', '0.5'])).toBe('[-0.25, 0.5]'); // a wide box around 0 stays an interval
  });

  it('"0 ± r" and the modulus form never claim more than the interval (property; oracle decimal.js)', () => {
    const dec = fc.tuple(fc.boolean(), fc.bigInt({ min: 0n, max: 10n ** 30n }), fc.integer({ min: -330, max: 30 })).map(([neg, d, e]) => `${neg ? '-' : ''}${d}e${e}`);
    fc.assert(
      fc.property(dec, dec, (a, b) => {
        const [lo, hi] = new D(a).lte(new D(b)) ? [a, b] : [b, a];
        const check = (shown: string, modulus: boolean) => {
          // a modulus is ≥ 0, so the shown lower end may be max(lo, 0); an interval's may not
          const floor = modulus ? D.max(new D(lo), 0) : new D(lo);
          const pm = /^0 ± (.+)$/.exec(shown);
          const iv = /^\[(.*), (.*)\]$/.exec(shown);
          if (shown === '0') expect(floor.lte(0) && new D(hi).lte(0) && (modulus || new D(lo).gte(0))).toBe(true);
          else if (pm) {
            expect(new D(pm[1]!).gte(new D(lo).abs())).toBe(true);
            expect(new D(pm[1]!).gte(new D(hi).abs())).toBe(true);
          } else {
            expect(new D(iv![1]!).lte(floor)).toBe(true);
            expect(new D(iv![2]!).gte(new D(hi))).toBe(true);
          }
        };
        check(formatInterval([lo, hi], 6), false);
        check(formatModulus([lo, hi], 6), true);
      }),
      { numRuns: 400, verbose: true },
    );
  });
});

describe('fitted tables', () => {
  it('never cut a word and keep every word, at any width (property)', () => {
    const word = fc.oneof(
      fc.stringMatching(/^[a-z]{1,12}$/),
      fc.tuple(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.double({ noNaN: true, noDefaultInfinity: true })).map(([a, b]) => `[${a}, ${b}]`),
    );
    const cell = fc.array(word, { minLength: 1, maxLength: 6 }).map((ws) => ws.join(' '));
    fc.assert(
      fc.property(fc.array(fc.array(cell, { minLength: 4, maxLength: 4 }), { minLength: 1, maxLength: 5 }), fc.integer({ min: 30, max: 200 }), (rows, width) => {
        const out = table(['a', 'bb', 'ccc', 'dddd'], rows, width);
        const tokens = (s: string) => s.split(/\s+/).filter((t) => t !== '' && !/^-+$/.test(t)).map((t) => t.replace(/:$/, '')).sort();
        const inWords = tokens(['a bb ccc dddd', ...rows.map((r) => r.join(' '))].join(' '));
        expect(tokens(out)).toEqual(expect.arrayContaining(inWords));
        for (const line of out.split('\n')) {
          // a line is longer than the width only when it holds one word that alone is longer
          if (line.length > width) expect(line.trim().split(/\s{2,}/).some((w) => w.length > width - 30)).toBe(true);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('wrapLine keeps intervals whole', () => {
    expect(wrapLine('x0: x ∈ [-0.4758, -0.4757], y ∈ [0.2927, 0.2928]', 30, 2)).toEqual(['x0: x ∈ [-0.4758, -0.4757], y', '  ∈ [0.2927, 0.2928]']);
  });

  it('terminalWidth: COLUMNS first, then the terminal, else 80', () => {
    expect(terminalWidth('132', 90)).toBe(132);
    expect(terminalWidth(undefined, 90)).toBe(90);
    expect(terminalWidth('abc', undefined)).toBe(80);
    expect(terminalWidth(undefined, undefined)).toBe(80);
  });
});

describe('snapshots at 80 and 120 columns', async () => {
  // logistic r = 3.83, period 3: the attracting cycle has Λ ≈ 0.32988 (proofs/README.md), Hénon
  // a = 1.4, b = 0.3 period 2: det M = b² = 0.09 (closed form, derived by hand)
  const logistic = getCatalogueMap('logistic');
  const logisticReport = await certifyOrbits(logistic, compileMap(logistic, { r: { kind: 'exact', value: '3.83' } }), { period: 3, outDir: join(work, 'l'), all: true });
  const henon = getCatalogueMap('henon');
  const henonReport = await certifyOrbits(henon, compileMap(henon), { period: 2, outDir: join(work, 'h'), all: true });
  const checks = checkPaths([join(root, 'proofs/logistic/r3.2'), join(root, 'proofs/henon/henon-map-p2-1.json')]).map((r) => ({ ...r, elapsedMs: 12 }));

  for (const width of [80, 120]) {
    it(`prove (1-D and 2-D) and check at ${width} columns`, () => {
      // runCli fits the lines outside tables with fitText; the same here
      const p1 = fitText(renderProve(logisticReport, 'Logistic map — period 3; r = 3.83 (--param)', work, width), width);
      const p2 = fitText(renderProve(henonReport, 'Hénon map — period 2; a = 1.4, b = 0.3', work, width), width);
      const c = fitText(renderCheck(checks, root, width), width);
      for (const text of [p1, p2, c]) expect(longest(text.replace(/^certificates in .*$/m, ''))).toBeLessThanOrEqual(width);
      expect(p1).toMatch(/Λ ∈ \[0\.3298816\d*, 0\.329881\d*\]/);
      expect(p2).toMatch(/det M ∈ \[0\.0899999\d*, 0\.0900000\d*\]/);
      expect(`${p1.replace(work, 'WORK')}\n\n${p2.replace(work, 'WORK')}\n\n${c}`).toMatchSnapshot();
    });
  }

  it('every command fits 80 columns through runCli (show, find, prove, check, demo)', async () => {
    const commands = [
      ['show', 'henon'],
      ['find', 'logistic', '--period', '4', '--param', 'r=3.9'],
      ['prove', 'henon', '--period', '1', '--out', join(work, 'c')],
      ['check', join(root, 'proofs/demo')],
      ['demo', '--out', join(work, 'demo')],
    ];
    for (const argv of commands) {
      const r = await runCli(argv, { cwd: work, columns: 80 });
      expect(r.exitCode, argv.join(' ')).toBe(0);
      expect(longest(r.stdout), `${argv.join(' ')}\n${r.stdout}`).toBeLessThanOrEqual(80);
    }
  });
});
