/**
 * Tamper tests for the kinds periodic-window, bifurcation-edge and periodic-absence: each mutant
 * is re-sealed with a correct hash, so only the mathematics (or the schema) can reject it.
 * Mutants per kind: window 10, edge 7, absence 6 (plus one unsealed edit per kind for the hash).
 */
import { describe, expect, it } from 'vitest';
import { buildAbsenceCertificate, buildEdgeCertificate, buildWindowCertificate } from '../../src/certificate/build-window.js';
import { checkCertificate } from '../../src/checker/index.js';
import { resolveMap } from '../../src/model/index.js';
import { proveAbsenceOverRange } from '../../src/windows/absence.js';
import { coverWindow } from '../../src/windows/cover.js';
import { findEdges } from '../../src/windows/edges.js';
import { seal } from './certs.js';

type Doc = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
const logistic = resolveMap('logistic');
const clone = (d: unknown): Doc => JSON.parse(JSON.stringify(d)) as Doc;
const verdict = (d: Doc) => checkCertificate(JSON.stringify(d)).verdict;

function mutants(base: Doc, list: [string, (d: Doc) => void][]): void {
  it('the untouched certificate is VERIFIED', () => expect(verdict(base)).toBe('VERIFIED'));
  it('an edit without a new hash is REJECTED', () => {
    const d = clone(base);
    d.period = d.period + 1;
    expect(checkCertificate(JSON.stringify(d)).reason).toMatch(/sha256/);
  });
  // the schema forbids unknown keys; a note a person could read as a claim must not pass
  // (issue 7's finding for orbit certificates, here for every kind) — common practice, no source
  it('REJECTED: an unknown top-level key ("note": a claim the checker never read)', () => {
    const d = clone(base);
    d.note = 'all period-3 orbits for r in [3.8, 3.9]';
    expect(checkCertificate(JSON.stringify(seal(d))).reason).toMatch(/unknown key "note"/);
  });
  for (const [name, edit] of list) {
    it(`REJECTED: ${name}`, () => {
      const d = clone(base);
      edit(d);
      expect(verdict(seal(d) as Doc)).toBe('REJECTED');
    });
  }
}

describe('periodic-window mutants', () => {
  const c = coverWindow(logistic, {}, 'r', ['3.8285', '3.8414'], 3);
  const base = clone(buildWindowCertificate({ ...c, pieces: c.pieces.map((p) => ({ param: p.param, centre: p.orbit.centre, boxes: p.orbit.boxes, minimalPeriod: p.orbit.minimalPeriod, stability: p.orbit.stability, joinedToNext: p.joinedToNext })) }, logistic));
  mutants(base, [
    ['a box shrunk to its centre', (d) => (d.pieces[0].boxes[1][0] = [d.pieces[0].centre[1][0], d.pieces[0].centre[1][0]])],
    ['stability attracting → repelling', (d) => (d.pieces[2].stability.class = 'repelling')],
    ['a multiplier enclosure narrowed', (d) => (d.pieces[0].stability.multiplier = ['0', '0'])],
    ['last piece past the range end', (d) => (d.pieces[d.pieces.length - 1].param[1] = '3.8415')],
    ['a piece removed (the range is no longer tiled)', (d) => d.pieces.splice(3, 1)],
    ['the range in map.params widened', (d) => ((d.map.params.r = ['3.8285', '3.85']), (d.range = ['3.8285', '3.85']))],
    ['the last piece joined to nothing', (d) => (d.pieces[d.pieces.length - 1].joinedToNext = true)],
    ['the formula changed', (d) => (d.map.step.x = 'r*x*(1 - x) + 0.01')],
    ['point 1 boxes replaced by point 0 boxes', (d) => ((d.pieces[0].boxes[1] = d.pieces[0].boxes[0]), (d.pieces[0].centre[1] = d.pieces[0].centre[0]))],
    ['a piece widened over the fold (1 + √8)', (d) => ((d.map.params.r = ['3.82', '3.8414']), (d.range = ['3.82', '3.8414']), (d.pieces[0].param[0] = '3.82'))],
  ]);
});

describe('bifurcation-edge mutants', () => {
  const range: [string, string] = ['3.82', '3.835'];
  const [fold] = findEdges(logistic, {}, 'r', range, 3, ['fold'], { samples: 6, search: false });
  const base = clone(buildEdgeCertificate(fold!, logistic, range));
  mutants(base, [
    ['parameter enclosure shifted off 1 + √8', (d) => (d.param = ['3.8284271247462', '3.8284271247463'])],
    ['fold relabelled flip', (d) => (d.edge = 'flip')],
    ['centre parameter outside its box', (d) => (d.centre.param = '3.9')],
    ['orbit box shrunk to its centre', (d) => (d.boxes[0] = [d.centre.orbit[0], d.centre.orbit[0]])],
    ['map.params range no longer holds the enclosure', (d) => (d.map.params.r = ['3.83', '3.835'])],
    ['a formula with a kink (abs)', (d) => (d.map.step.x = 'r*x*abs(1 - x)')],
    ['unknown edge kind', (d) => (d.edge = 'cusp')],
  ]);
});

describe('periodic-absence mutants', () => {
  const point = proveAbsenceOverRange(logistic, {}, 'r', ['3.82', '3.82'], 3);
  const noFold = proveAbsenceOverRange(logistic, {}, 'r', ['3.8293', '3.8295'], 3, { condition: 'fold' });
  if (point.status !== 'proven' || noFold.status !== 'proven') throw new Error('fixtures not proven');
  const base = clone(buildAbsenceCertificate({ period: 3, parameter: 'r', range: point.range, region: point.region, pieces: point.pieces }, logistic));
  const baseFold = clone(buildAbsenceCertificate({ period: 3, parameter: 'r', range: noFold.range, region: noFold.region, pieces: noFold.pieces, condition: 'fold' }, logistic));
  mutants(base, [
    ['moved into the window (r = 3.83, where period-3 orbits exist)', (d) => ((d.map.params.r = '3.83'), (d.range = ['3.83', '3.83']), (d.pieces[0].param = ['3.83', '3.83']))],
    ['a leaf dropped (the region is no longer tiled)', (d) => d.pieces[0].leaves.splice(10, 1)],
    ['the region widened', (d) => (d.region = ['-1', '1'])],
    ['a lower-period leaf with a divisor that does not divide 3', (d) => (d.pieces[0].leaves.find((l: Doc) => l.kind === 'lower').divisor = 2)],
  ]);
  it('the fold-free certificate is VERIFIED', () => expect(verdict(baseFold)).toBe('VERIFIED'));
  for (const [name, edit] of [
    ['fold-free range stretched over 1 + √8', (d: Doc) => ((d.map.params.r = ['3.8283', '3.8295']), (d.range = ['3.8283', '3.8295']), (d.pieces[0].param[0] = '3.8283'))],
    ['multiplier leaves without a condition', (d: Doc) => delete d.condition],
  ] as [string, (d: Doc) => void][]) {
    it(`REJECTED: ${name}`, () => {
      const d = clone(baseFold);
      edit(d);
      expect(verdict(seal(d) as Doc)).toBe('REJECTED');
    });
  }
});

describe('schema/windows-v1.schema.json', () => {
  it('accepts a window, an edge and an absence certificate, and refuses a misspelt field', async () => {
    const { readFileSync } = await import('node:fs');
    const { join } = await import('node:path');
    const { validate } = await import('../certificate/mini-schema.js');
    const schema = JSON.parse(readFileSync(join(__dirname, '../../schema/windows-v1.schema.json'), 'utf8'));
    const c = coverWindow(logistic, {}, 'r', ['3.835', '3.8414'], 3);
    const w = buildWindowCertificate({ ...c, pieces: c.pieces.map((p) => ({ param: p.param, centre: p.orbit.centre, boxes: p.orbit.boxes, minimalPeriod: p.orbit.minimalPeriod, stability: p.orbit.stability, joinedToNext: p.joinedToNext })) }, logistic);
    const [flip] = findEdges(logistic, {}, 'r', ['3.84', '3.845'], 3, ['flip'], { samples: 4, search: false });
    const e = buildEdgeCertificate(flip!, logistic, ['3.84', '3.845']);
    const a0 = proveAbsenceOverRange(logistic, {}, 'r', ['3.5', '3.5'], 3);
    if (a0.status !== 'proven') throw new Error('fixture');
    const a = buildAbsenceCertificate({ period: 3, parameter: 'r', range: a0.range, region: a0.region, pieces: a0.pieces }, logistic);
    for (const doc of [w, e, a]) expect(validate(schema, doc)).toEqual([]);
    expect(validate(schema, { ...e, edges: 'fold' }).length).toBeGreaterThan(0);
  });
});
