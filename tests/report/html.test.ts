// Check values: the committed certificates in proofs/ (re-verified by the checker here) and closed
// forms derived by hand, noted beside each; the rest are invented inputs (hostile titles, kinds).
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { claimText, collectEntries, kindView, registerKindView, renderReportHtml, type ReportEntry } from '../../src/report/index.js';
import { radial } from '../../src/report/plots.js';
import type { CertificateV1 } from '../../src/certificate/types.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const entries = collectEntries([join(root, 'proofs/logistic/r3.2'), join(root, 'proofs/examples/harvested-fishery-p1-2.json')], root);

describe('renderReportHtml', () => {
  it('is self-contained: no script, no external URL, a CSP that forbids loading anything', () => {
    const { html } = renderReportHtml(entries);
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/<(link|img|iframe|object|embed)\b/i);
    // the only URL is the SVG namespace name (an identifier, never fetched)
    expect([...html.matchAll(/https?:\/\/[^"' )]+/g)].map((m) => m[0]).every((u) => u === 'http://www.w3.org/2000/svg')).toBe(true);
    expect(html).toContain(`content="default-src 'none'; style-src 'unsafe-inline'"`);
  });

  it('states the claim in words: period-2 orbit at r = 3.2 is attracting with Λ ∋ 4 + 2r − r² = 0.16', () => {
    const cert = entries[0]!.certificate as unknown as CertificateV1;
    const text = claimText(cert);
    // Λ = 4 + 2r − r² for the period-2 orbit of the logistic map (closed form, derived by hand): 0.16 at r = 3.2
    expect(text).toMatch(/r = 3\.2 \(exact decimals\)/);
    expect(text).toMatch(/minimal period is exactly 2/);
    const m = /Λ ∈ \[([\d.]+), ([\d.]+)\]/.exec(text)!;
    expect(Number(m[1])).toBeLessThanOrEqual(0.16);
    expect(Number(m[2])).toBeGreaterThanOrEqual(0.16);
    expect(text).toMatch(/attracting/);
  });

  it('an interval parameter reads "for every h in [lo, hi]" (harvested fishery, h ∈ [0.10, 0.12])', () => {
    const cert = entries[1]!.certificate as unknown as CertificateV1;
    expect(claimText(cert)).toMatch(/^For every h in \[0\.10?, 0\.12\]/);
  });

  it('escapes certificate text (a hostile title cannot inject markup)', () => {
    const cert = JSON.parse(JSON.stringify(entries[0]!.certificate)) as CertificateV1;
    cert.map.title = '<img src=x onerror=alert(1)>';
    const { html } = renderReportHtml([{ ...entries[0]!, certificate: cert as unknown as ReportEntry['certificate'] }]);
    expect(html).not.toContain('<img');
    expect(html).toContain('&lt;img src=x onerror=alert(1)&gt;');
  });

  it('a rejected or unreadable file states nothing and draws nothing', () => {
    const bad: ReportEntry[] = [
      { file: 'a.json', verdict: 'REJECTED', reason: 'sha256 mismatch', path: '$.sha256', claimsVerified: [] },
      { file: 'b.json', verdict: 'UNREADABLE', reason: 'malformed JSON', claimsVerified: [] },
    ];
    const { html, plots } = renderReportHtml(bad);
    expect(plots).toEqual([]);
    expect(html.match(/Nothing in this file is proven/g)).toHaveLength(2);
    expect(html).not.toMatch(/re-verified by the independent checker\./);
  });

  it('views are looked up by kind: an unknown kind says so, a registered one is used', () => {
    const other: ReportEntry = { file: 'w.json', verdict: 'VERIFIED', claimsVerified: ['existence'], certificate: { kind: 'test-window' } };
    expect(renderReportHtml([other]).html).toContain('no view for certificate kind “test-window” yet');
    expect(kindView('test-window')).toBeUndefined();
    registerKindView({
      kind: 'test-window',
      render: () => ({ heading: 'A window', claim: 'claimed window', facts: [], plots: [], summary: { map: 'm', what: 'w', parameters: 'p', stability: 's' } }),
    });
    expect(renderReportHtml([other]).html).toContain('claimed window');
  });

  it('one bifurcation diagram per 1-D family with its boxes; a 1-D map gets a cobweb', () => {
    const { plots } = renderReportHtml(entries);
    const ids = plots.map((p) => p.id);
    expect(ids.filter((id) => id.startsWith('bifurcation-'))).toHaveLength(2); // logistic (r), fishery (h)
    expect(plots.find((p) => p.id === 'bifurcation-1')!.boxes).toBe(2); // period-2 orbit: two boxes
    expect(ids).toContain('cert-1-cobweb');
  });
});

describe('radial scale of the unit-circle plot', () => {
  it('is the identity inside, 2 − 1/r outside (values derived by hand), and monotone', () => {
    expect(radial(0)).toBe(0);
    expect(radial(0.5)).toBe(0.5);
    expect(radial(1)).toBe(1);
    expect(radial(2)).toBe(1.5);
    expect(radial(10)).toBeCloseTo(1.9, 12);
    expect(radial(Infinity)).toBe(2);
    expect(radial(NaN)).toBe(0);
    for (let r = 0; r < 50; r += 0.37) expect(radial(r + 0.37)).toBeGreaterThan(radial(r));
  });
});
