// The report's views of the other certificate kinds (window, edge, absence, count, flow), on
// certificates written by the real commands (kinds-fixture.ts) and re-checked by the checker.
// Check values and their sources are noted beside each.
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CertificateV1, CountCertificateV1, WindowCertificateV1 } from '../../src/certificate/types.js';
import { runCli } from '../../src/cli/program.js';
import { decodeCover } from '../../src/report/count.js';
import { floatFlow } from '../../src/report/flow-float.js';
import { collectEntries, kindView, registeredKinds, renderReportHtml, type ReportEntry } from '../../src/report/index.js';
import { writeKindSamples, type KindSamples } from './kinds-fixture.js';

// 1 + √8: the parameter where the period-3 window of the logistic map opens by a fold
// (P. Saha and S. H. Strogatz 1995, "The birth of period three", Mathematics Magazine 68(1)).
const FOLD3 = 1 + Math.sqrt(8);
// the period-3 orbit's flip (period doubling to 6): r ≈ 3.8414990075 (from memory; the edges command agrees)
const FLIP3 = 3.8414990075;

const work = mkdtempSync(join(tmpdir(), 'orbitseal-report-kinds-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));
let s: KindSamples;
let entries: ReportEntry[];
const byFile = (f: string) => entries.find((e) => f.endsWith(e.file))!;
const count = (svg: string, re: RegExp) => (svg.match(re) ?? []).length;

beforeAll(async () => {
  s = await writeKindSamples(work);
  entries = collectEntries([s.dir], s.dir);
}, 120_000);

describe('kind views are registered and used', () => {
  it('every certificate kind the commands write has a view', () => {
    expect(registeredKinds()).toEqual(['bifurcation-edge', 'flow-periodic-orbit', 'periodic-absence', 'periodic-orbit', 'periodic-orbit-count', 'periodic-window']);
    for (const e of entries) if (e.verdict === 'VERIFIED') expect(kindView(e.certificate!.kind), e.file).toBeDefined();
    // the independent checker re-verifies these five kinds (flows: not yet, so no claim is shown)
    for (const f of [s.window, s.fold, s.flip, s.absence, s.count]) expect(byFile(f).verdict, f).toBe('VERIFIED');
  });
});

describe('periodic-window view', () => {
  it('pieces lie between the fold 1 + √8 and the flip; strip draws every piece box, gaps hatched with reasons', () => {
    const e = byFile(s.window);
    const cert = e.certificate as unknown as WindowCertificateV1;
    expect(cert.gaps.length).toBeGreaterThan(0); // the range starts before the window opens
    for (const p of cert.pieces) {
      expect(Number(p.param[0])).toBeGreaterThanOrEqual(FOLD3 - 1e-12);
      expect(Number(p.param[1])).toBeLessThanOrEqual(FLIP3 + 1e-9);
    }
    const v = kindView('periodic-window')!.render(e.certificate!, 'w');
    expect(v.claim).toMatch(new RegExp(`For every r in each of the ${cert.pieces.length} proven pieces`));
    expect(v.claim).toMatch(/nothing is claimed/);
    const strip = v.plots.find((p) => p.id === 'w-strip')!;
    expect(strip.boxes).toBe(cert.pieces.length * 3);
    expect(count(strip.svg, /class="proof-box"/g)).toBe(strip.boxes);
    expect(count(strip.svg, /class="param-band band-gap"/g)).toBe(cert.gaps.length);
    for (const g of cert.gaps) expect(strip.svg).toContain(g.reason.replace(/&/g, '&amp;').slice(0, 20));
    // the multiplier plot: every box between the reference lines Λ = +1 and Λ = −1 (attracting)
    const mult = v.plots.find((p) => p.id === 'w-multiplier')!;
    expect(count(mult.svg, /class="reference"/g)).toBe(2);
    expect(mult.boxes).toBe(cert.pieces.length);
    const rows = v.tables![0]!.rows;
    expect(rows[0]!.slice(0, 2)).toEqual(['gap 1', '3.8284']); // the range starts with a gap
    expect(rows.filter((r) => r[0]!.startsWith('gap')).length).toBe(cert.gaps.length);
  });
});

describe('bifurcation-edge view', () => {
  it('the fold encloses 1 + √8 and marks Λ = +1; the flip marks Λ = −1 on the unit circle', () => {
    const fold = byFile(s.fold).certificate!;
    const p = fold['param'] as [string, string];
    expect(Number(p[0])).toBeLessThanOrEqual(FOLD3 + 1e-15);
    expect(Number(p[1])).toBeGreaterThanOrEqual(FOLD3 - 1e-15);
    const v = kindView('bifurcation-edge')!.render(fold, 'f');
    expect(v.claim).toMatch(/exactly \+1 \(a fold\)/);
    expect(v.facts.find(([k]) => k === 'width')![1]).toMatch(/e-1[0-9]$/);
    const circle = v.plots.find((q) => q.id === 'f-multiplier')!;
    // the unit circle is drawn at radius 70 around (160, 160): +1 sits at x = 230, −1 at x = 90
    const x = (svg: string) => {
      const m = /class="enclosure" x="([\d.]+)" y="[\d.]+" width="([\d.]+)"/.exec(svg)!;
      return Number(m[1]) + Number(m[2]) / 2;
    };
    expect(x(circle.svg)).toBeCloseTo(230, 6);
    const flip = kindView('bifurcation-edge')!.render(byFile(s.flip).certificate!, 'g');
    expect(x(flip.plots.find((q) => q.id === 'g-multiplier')!.svg)).toBeCloseTo(90, 6);
    expect(flip.claim).toMatch(/exactly −1 \(a flip/);
    const range = v.plots.find((q) => q.id === 'f-range')!;
    expect(count(range.svg, /class="edge-mark"/g)).toBe(1);
    expect(range.boxes).toBe(3); // the period-3 orbit at the edge
  });
});

describe('periodic-absence view', () => {
  it('states the parameter and region covered and draws every leaf of the cover', () => {
    const cert = byFile(s.absence).certificate!;
    const leaves = (cert['pieces'] as { leaves: unknown[] }[]).reduce((k, p) => k + p.leaves.length, 0);
    const v = kindView('periodic-absence')!.render(cert, 'a');
    expect(v.claim).toMatch(/^For r = 3\.82, in the region x ∈ \[0, 1\]/);
    expect(v.claim).toContain(`cover of ${leaves} leaves`);
    expect(count(v.plots[0]!.svg, /class="cover-leaf /g)).toBe(leaves);
    expect(v.plots[0]!.boxes).toBe(leaves);
  });
});

describe('periodic-orbit-count view', () => {
  it('per-period table matches OEIS A001037 for p = 1, 2, 3 at r = 3.83 (all of them exist past 1 + √8)', () => {
    const cert = byFile(s.count).certificate!;
    const v = kindView('periodic-orbit-count')!.render(cert, 'c');
    // A001037 (binary Lyndon words = orbits of minimal period n of the full 2-shift): 2, 1, 2, 3, …;
    // for 1 + √8 < r ≤ 4 the logistic map has all of its period-1, 2 and 3 orbits (Saha & Strogatz 1995)
    const rows = v.tables![0]!.rows;
    expect(rows.slice(0, 3).map((r) => r.slice(0, 2))).toEqual([
      ['1', '2'],
      ['2', '1'],
      ['3', '2'],
    ]);
    expect(rows[2]![2]).toBe('2×p1'); // the two fixed points are period-3 points too
    expect(rows[2]![3]).toBe('8');
    expect(v.claim).toMatch(/period 3: exactly 8 points/); // 2 fixed points + 2 × 3 (derived by hand)
    expect(v.plots.map((p) => p.id)).toEqual(['c-orbits-p4', 'c-cover-p1', 'c-cover-p2', 'c-cover-p3', 'c-cover-p4']);
    // one box on the diagonal per leaf holding a zero of the period-4 system
    const stars4 = (cert['counts'] as { pieces: string[] }[])[3]!.pieces.join('').split('*').length - 1;
    expect(v.plots[0]!.boxes).toBe(stars4);
    for (const p of v.plots) {
      expect(count(p.svg, /class="proof-box zero-leaf"/g)).toBe(p.boxes);
      if (p.id.includes('-cover-')) expect(p.svg).toContain('class="depth-cells"');
    }
  });

  it('a 2-D count (Hénon map) is drawn on the plane of the first point, its undecided leaves highlighted', async () => {
    // a shooting-method count (--method shooting; box-graph counts have no view yet) whose cover stays
    // partly undecided: the counts are lower bounds and the plot shows where
    const dir = join(work, 'henon');
    mkdirSync(dir, { recursive: true });
    const r = await runCli(['count', 'henon', '--period', '2', '--upto', '--method', 'shooting', '--out', 'henon-count.json', '--no-check'], { cwd: dir });
    expect(r.exitCode, r.stderr).toBeLessThanOrEqual(1);
    const [e] = collectEntries([join(dir, 'henon-count.json')], dir);
    expect(e!.verdict).toBe('VERIFIED');
    const cert = e!.certificate as unknown as CountCertificateV1;
    const v = kindView('periodic-orbit-count')!.render(e!.certificate!, 'h');
    cert.counts.forEach((c, i) => {
      const svg = v.plots[i]!.svg;
      // the certificate's own (re-verified) numbers of '?' and '*' leaves are what the plot draws
      expect(count(svg, /class="proof-box undecided-leaf"/g)).toBe(c.claims.undecidedBoxes);
      expect(count(svg, /class="proof-box zero-leaf"/g)).toBe(c.pieces.join('').split('*').length - 1);
      expect(svg).toContain(c.period === 1 ? '>y</text>' : '>y_0</text>');
      if (c.claims.undecidedBoxes > 0) expect(v.claim).toMatch(new RegExp(`period ${c.period}: at least`));
    });
    expect(v.summary.stability).toBe(cert.counts.every((c) => c.claims.undecidedBoxes === 0 && c.claims.undecidedZeros === 0) ? 'exact counts' : 'lower bounds');
  });

  it('the decoded cover tiles region^p: leaf volumes add up to the region volume (derived by hand: a tiling)', () => {
    const cert = byFile(s.count).certificate as unknown as CountCertificateV1;
    for (const e of cert.counts) {
      let volume = 0;
      let stars = 0;
      decodeCover(cert, e, (l) => {
        let v = 1;
        for (let k = 0; k < l.lo.length; k++) v *= l.hi[k]! - l.lo[k]!;
        volume += v;
        if (l.mark === '*') stars++;
      });
      expect(volume).toBeCloseTo(1, 12); // region [0, 1]^p has volume 1
      expect(stars).toBe(e.pieces.join('').split('*').length - 1);
    }
  });
});

describe('flow-periodic-orbit view', () => {
  // x'' + 2ζx' + x = cos ωt: the T-periodic solution is x = a cos ωt + b sin ωt with
  // a = (1 − ω²)/D, b = 2ζω/D, D = (1 − ω²)² + (2ζω)² (closed form, derived by hand), so at t = 0
  // x = a, v = ωb; both multipliers have modulus e^{−ζT}, T = 2π/ω (closed form, derived by hand).
  const zeta = 0.1;
  const omega = 1.3;
  const D = (1 - omega ** 2) ** 2 + (2 * zeta * omega) ** 2;
  const x0 = (1 - omega ** 2) / D;
  const v0 = (omega * 2 * zeta * omega) / D;

  it('draws the proven point with the float trajectory closing on it; T and multipliers shown', () => {
    const raw = JSON.parse(readFileSync(s.flow, 'utf8')) as CertificateV1;
    // the checker does not re-verify flows yet: the view is exercised directly, never shown unverified
    expect(byFile(s.flow).verdict).not.toBe('UNREADABLE');
    const v = kindView('flow-periodic-orbit')!.render(raw as unknown as ReportEntry['certificate'] & object, 'fl');
    expect(v.claim).toMatch(/^Here the map is the time-T map, T = 2\*pi\/omega/);
    const plot = v.plots.find((p) => p.id === 'fl-flow')!;
    expect(plot.boxes).toBe(1);
    expect(plot.svg).toContain('class="float-trajectory"');
    expect(plot.description).toMatch(/illustration only, not part of the proof/);
    const path = floatFlow(raw.map)!.segment([x0, v0])!;
    const end = path.points[path.points.length - 1]!;
    expect(Math.abs(end[0]! - x0)).toBeLessThan(1e-7);
    expect(Math.abs(end[1]! - v0)).toBeLessThan(1e-7);
    expect(path.time).toBeCloseTo((2 * Math.PI) / omega, 12);
    const m = /\[([\d.]+), ([\d.]+)\]/.exec(v.facts.find(([k]) => k === 'eigenvalue moduli')![1])!;
    const mod = Math.exp((-zeta * 2 * Math.PI) / omega);
    expect(Number(m[1])).toBeLessThanOrEqual(mod + 1e-8);
    expect(Number(m[2])).toBeGreaterThanOrEqual(mod - 1e-8);
    expect(v.facts.find(([k]) => k === 'flow period')![1]).toBe('T = 2*pi/omega');
  });

  it('property: the float integrator follows the harmonic oscillator (rotation by angle T, closed form)', () => {
    const map = { title: 'rotation', state: ['x', 'y'], params: {}, step: {}, flow: { rhs: { x: 'y', y: '-x' }, time: 't', duration: '1.25' } };
    const ff = floatFlow(map)!;
    fc.assert(
      fc.property(fc.double({ min: -10, max: 10, noNaN: true }), fc.double({ min: -10, max: 10, noNaN: true }), (a, b) => {
        const end = ff.segment([a, b])!.points.at(-1)!;
        const c = Math.cos(1.25);
        const sn = Math.sin(1.25);
        const tol = 1e-9 * (1 + Math.hypot(a, b));
        return Math.abs(end[0]! - (a * c + b * sn)) < tol && Math.abs(end[1]! - (-a * sn + b * c)) < tol;
      }),
      { numRuns: 40 },
    );
  });
});

describe('float flow to a section (illustration only)', () => {
  it('the harmonic oscillator returns to the section y = 0 (downwards) after 2π at its start point (closed form)', () => {
    const map = { title: 'rotation', state: ['x', 'y'], params: {}, step: {}, flow: { rhs: { x: 'y', y: '-x' }, section: { surface: 'y', crossing: 'decreasing' as const } } };
    for (const a of [0.5, 1, 3]) {
      const seg = floatFlow(map)!.segment([a, 0])!;
      expect(seg.time).toBeCloseTo(2 * Math.PI, 4);
      const end = seg.points.at(-1)!;
      expect(end[0]!).toBeCloseTo(a, 4);
      expect(Math.abs(end[1]!)).toBeLessThan(1e-4);
    }
  });
});

describe('the folder bifurcation diagram overlays windows, gaps, absences and edges', () => {
  it('one diagram for the logistic map with 1 window band, every gap, 1 absence band and 2 edge lines', () => {
    const { html, plots } = renderReportHtml(entries);
    const window = byFile(s.window).certificate as unknown as WindowCertificateV1;
    const diag = plots.filter((p) => p.id.startsWith('bifurcation-'));
    expect(diag).toHaveLength(1); // the bracket is 2-D, the count has no parameter range to place
    const svg = diag[0]!.svg;
    expect(count(svg, /class="param-band band-window"/g)).toBe(1);
    expect(count(svg, /class="param-band band-gap"/g)).toBe(window.gaps.length);
    expect(count(svg, /class="param-band band-absence"/g)).toBe(1);
    expect(count(svg, /class="edge-mark"/g)).toBe(2);
    // proof boxes: window pieces × 3 + the fold's and the flip's 3 orbit points each
    expect(diag[0]!.boxes).toBe(window.pieces.length * 3 + 6);
    expect(html).toMatch(/Certificates on it: /);
  });
});
