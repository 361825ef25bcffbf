/**
 * Rendering very large results (regressions found in a new-user trial: `find logistic r=4
 * --period 100` overflowed the call stack): the table and the find listing stay linear.
 */
import { describe, expect, it } from 'vitest';
import { table } from '../../src/cli/format.js';
import { MAX_CANDIDATES_SHOWN, renderFind } from '../../src/cli/commands/find.js';
import type { Candidate } from '../../src/search/index.js';

describe('big outputs do not overflow the call stack (trial: find logistic r=4 --period 100 crashed)', () => {
  it('table with 210 000 lines: widths are the longest cell, no RangeError', () => {
    // Math.max(...spread) over ~10^5 arguments throws RangeError in V8 (common practice, no source)
    const rows: string[][] = [];
    for (let i = 0; i < 70_000; i++) rows.push([String(i), 'a\nbb\nccc']);
    rows.push(['x', 'wide-cell-at-the-end']);
    const t = table(['#', 'cell'], rows);
    const lines = t.split('\n');
    expect(lines.length).toBe(2 + 210_000 + 1);
    // column 1 width = len('69999') = 5, then two spaces; last row's cell starts at column 7
    expect(lines[lines.length - 1]).toBe('x      wide-cell-at-the-end');
    expect(lines[1]).toBe('-----  ' + '-'.repeat('wide-cell-at-the-end'.length));
  });

  it(`renderFind lists at most ${MAX_CANDIDATES_SHOWN} candidates and says how many more (40 000 × 100 points)`, () => {
    const period = 100;
    const cands: Candidate[] = [];
    const points: number[][] = [];
    for (let k = 0; k < period; k++) points.push([k / 128]);
    for (let i = 0; i < 40_000; i++) {
      cands.push({ period, points, residual: 1e-15, multipliers: [2 ** 100], stabilityGuess: 'repelling' });
    }
    const text = renderFind(cands, 'header', ['x'], period);
    expect(text).toMatch(/candidates \(float search, not proofs\): 40000 of minimal period 100/);
    expect(text).toMatch(new RegExp(`… ${40_000 - MAX_CANDIDATES_SHOWN} more; use --json for all`));
    expect(text).toMatch(new RegExp(`^${MAX_CANDIDATES_SHOWN} `, 'm'));
    expect(text).not.toMatch(new RegExp(`^${MAX_CANDIDATES_SHOWN + 1} `, 'm'));
  });
});
