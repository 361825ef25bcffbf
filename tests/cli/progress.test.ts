// Progress lines: hand-computed rates and times left (common practice, no source).
import { describe, expect, it } from 'vitest';
import { createProgress, progressText, shortDuration } from '../../src/cli/progress.js';
import { runCli } from '../../src/cli/program.js';

describe('progress', () => {
  it('counts, rate and time left: 250 of 1000 in 2 s → 125/s, 750 left → ~6.0 s', () => {
    expect(progressText('search', 250, 1000, 'seeds', 2000, 80)).toBe('search  250/1000 seeds · 125/s · ~6.0 s left');
    expect(progressText('check', 4, 4, 'certificates', 15000, 80, 'VERIFIED a.json')).toBe('check  4/4 certificates · 0.27/s  VERIFIED a.json');
    expect(progressText('check', 1, 9, 'certificates', 0, 80)).toBe('check  1/9 certificates');
  });

  it('fits the width and shortens durations', () => {
    expect(progressText('check', 1, 2, 'certificates', 10, 40, 'x'.repeat(100)).length).toBe(39);
    expect(shortDuration(400)).toBe('0.4 s');
    expect(shortDuration(185_000)).toBe('3 min 5 s');
    expect(shortDuration(7_440_000)).toBe('2 h 4 min');
  });

  it('throttles to ~10 updates a second, always shows the last, and clears the line', () => {
    const out: string[] = [];
    let t = 0;
    const bar = createProgress((s) => out.push(s), 80, () => t);
    for (let i = 1; i <= 100; i++) {
      t += 5; // 5 ms per step: 500 ms in all
      bar.update('search', i, 100, 'seeds');
    }
    bar.finish();
    expect(out.length).toBeGreaterThanOrEqual(5);
    expect(out.length).toBeLessThanOrEqual(8);
    expect(out[out.length - 2]).toContain('search  100/100 seeds');
    expect(out[out.length - 1]).toBe('\r\x1b[K');
  });

  it('no sink, no output; check streams one update per file to the sink', async () => {
    const silent = createProgress(undefined);
    silent.update('x', 1, 2, 'y');
    silent.finish();
    const seen: string[] = [];
    const r = await runCli(['check', 'proofs/demo'], { progress: (s) => seen.push(s) });
    expect(r.exitCode).toBe(0);
    expect(r.stderr).toBe('');
    expect(seen.some((s) => s.includes('check  7/7 certificates'))).toBe(true);
    expect(seen.filter((s) => s.includes('VERIFIED proofs/demo/')).length).toBeGreaterThanOrEqual(2);
  });
});
