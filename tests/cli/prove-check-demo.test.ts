/**
 * prove / check / demo through `runCli`: exit codes, labels ("proven, re-verified" only when the
 * independent checker agreed), certificate files, overwrite protection, tampering.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Decimal } from 'decimal.js';
import { afterAll, describe, expect, it } from 'vitest';
import { certificateHash } from '../../src/certificate/canonical.js';
import { runCli } from '../../src/cli/program.js';
import { validate } from '../certificate/mini-schema.js';

const D = Decimal.clone({ precision: 50 });
const schema = JSON.parse(readFileSync(join(dirname(fileURLToPath(import.meta.url)), '../../schema/certificate-v1.schema.json'), 'utf8'));
const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-prove-test-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));
const fresh = (name: string) => mkdtempSync(join(scratch, `${name}-`));

describe('orbitseal prove', () => {
  it('prove logistic --period 3 --param r=3.83: two orbits proven and re-verified, one attracting, one repelling; exit 0', async () => {
    const out = fresh('p3');
    const r = await runCli(['prove', 'logistic', '--period', '3', '--param', 'r=3.83', '--out', out]);
    expect(r.stderr).toBe('');
    expect(r.exitCode).toBe(0);
    // two period-3 orbits once r > 1 + √8 (C. Zhang, arXiv:1204.0546); one attracting, one repelling
    expect(r.stdout).toMatch(/candidates \(float search, not proofs\): 2 of minimal period 3/);
    expect(r.stdout.match(/proven, re-verified/g)).toHaveLength(2);
    expect(r.stdout).toMatch(/attracting/);
    expect(r.stdout).toMatch(/repelling/);
    expect(r.stdout).toMatch(/summary: 2 proven and re-verified by the independent checker\./);
    expect(readdirSync(out).sort()).toEqual(['logistic-map-r3.83-p3-1.json', 'logistic-map-r3.83-p3-2.json', 'logistic-map-r3.83-p3.run']);
    const cert = JSON.parse(readFileSync(join(out, 'logistic-map-r3.83-p3-1.json'), 'utf8'));
    expect(cert.map.params).toEqual({ r: '3.83' });
    expect(cert.sha256).toBe(certificateHash(cert));
  });

  it('a different existing file is never overwritten (exit 2, says --force); --force replaces', async () => {
    const out = fresh('again');
    const argv = ['prove', 'logistic', '--period', '1', '--param', 'r=2.5', '--out', out];
    expect((await runCli(argv)).exitCode).toBe(0);
    expect((await runCli(argv)).exitCode).toBe(0); // an identical re-run is not an error (issue 13)
    writeFileSync(join(out, 'logistic-map-r2.5-p1-1.json'), '{}\n');
    const again = await runCli(argv);
    expect(again.exitCode).toBe(2);
    expect(again.stderr).toMatch(/cert-exists[\s\S]*already exists[\s\S]*--force/);
    const forced = await runCli([...argv, '--force']);
    expect(forced.exitCode).toBe(0);
  });

  it('--no-check labels results "fast engine only", never "re-verified"', async () => {
    const r = await runCli(['prove', 'logistic', '--period', '1', '--param', 'r=2.5', '--out', fresh('nocheck'), '--no-check']);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/proven \(fast engine only, not re-verified\)/);
    expect(r.stdout).not.toMatch(/re-verified by the independent checker\.$/m);
    expect(r.stdout).not.toMatch(/proven, re-verified/);
  });

  it('--near picks one orbit; --json is one document whose boxes contain the closed form', async () => {
    const r = await runCli(['prove', 'logistic', '--period', '1', '--param', 'r=2.5', '--near', '0.6', '--out', fresh('near'), '--json']);
    expect(r.exitCode).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.orbits).toHaveLength(1);
    const o = doc.orbits[0];
    expect(o.status).toBe('verified');
    // fixed point 1 − 1/r = 0.6 and multiplier 2 − r = −0.5 (closed form, derived by hand)
    expect(new D(o.boxes[0][0][0]).lte('0.6') && new D('0.6').lte(o.boxes[0][0][1])).toBe(true);
    expect(new D(o.stability.multiplier[0]).lte('-0.5') && new D('-0.5').lte(o.stability.multiplier[1])).toBe(true);
    expect(o.stability.class).toBe('attracting');
    expect(o.check.claimsVerified).toContain('existence');
  });

  it('--param with an interval: the claim covers every value, and the certificate records the interval', async () => {
    const out = fresh('interval');
    const r = await runCli(['prove', 'logistic', '--period', '1', '--param', 'r=[2.5,2.6]', '--near', '0.6', '--out', out, '--json']);
    expect(r.exitCode).toBe(0);
    const o = JSON.parse(r.stdout).orbits[0];
    expect(o.status).toBe('verified');
    // fixed point 1 − 1/r for every r in [2.5, 2.6]: [0.6, 0.615384...] (closed form, derived by hand)
    expect(new D(o.boxes[0][0][0]).lte('0.6')).toBe(true);
    expect(new D(1).minus(new D(1).div('2.6')).lte(o.boxes[0][0][1])).toBe(true);
    const cert = JSON.parse(readFileSync(o.certificate, 'utf8'));
    expect(cert.map.params.r).toEqual(['2.5', '2.6']);
  });

  it('a neutral fixed point is reported "not proven" with a reason, never "proven"; exit 1', async () => {
    // f(x) = x − x³ has f(0) = 0 with multiplier f'(0) = 1 exactly (closed form, derived by hand):
    // the shooting Jacobian 1 − f'(0) is singular there, so no Krawczyk proof can exist
    const map = join(fresh('neutral'), 'neutral.yaml');
    writeFileSync(map, 'title: Neutral map\nstate: [x]\nparams: {}\nstep:\n  x: x - x^3\nregion:\n  x: [-0.5, 0.5]\n');
    const out = fresh('neutral-out');
    const r = await runCli(['prove', map, '--period', '1', '--out', out]);
    expect(r.exitCode).toBe(1);
    expect(r.stdout).toMatch(/^1 +not proven/m);
    expect(r.stdout).not.toMatch(/proven, re-verified|fast engine only/);
    expect(r.stdout).toMatch(/summary: 0 proven and re-verified by the independent checker; 1 not proven\./);
    expect(readdirSync(out).filter((f) => f.endsWith('.json'))).toEqual([]); // no certificate (only the run manifest)
  });

  it('no candidate → nothing proven, exit 1 (logistic r = 3.8 has no period-3 orbit: window opens at 1 + √8; arXiv:1204.0546)', async () => {
    const r = await runCli(['prove', 'logistic', '--period', '3', '--param', 'r=3.8', '--out', fresh('none')]);
    expect(r.exitCode).toBe(1);
    expect(r.stdout).toMatch(/nothing proven/);
  });
});

describe('orbitseal check', () => {
  it('VERIFIED for honest files (exit 0); REJECTED for a tampered parameter (exit 1); UNREADABLE for garbage', async () => {
    const out = fresh('check');
    expect((await runCli(['prove', 'logistic', '--period', '2', '--param', 'r=3.2', '--out', out, '--no-check'])).exitCode).toBe(0);
    const ok = await runCli(['check', out]);
    expect(ok.exitCode).toBe(0);
    expect(ok.stdout).toMatch(/^VERIFIED\s+.*logistic-map-r3\.2-p2-1\.json\s+re-verified: existence/m);
    expect(ok.stdout).toMatch(/1 verified, 0 rejected, 0 unreadable/);

    // change r from 3.2 to 3.3 and re-hash: the mathematics must catch it, not the hash
    const file = join(out, 'logistic-map-r3.2-p2-1.json');
    const cert = JSON.parse(readFileSync(file, 'utf8'));
    cert.map.params.r = '3.3';
    cert.sha256 = certificateHash(cert);
    writeFileSync(join(out, 'tampered.json'), JSON.stringify(cert));
    writeFileSync(join(out, 'garbage.json'), '{"format": ');
    const mixed = await runCli(['check', out]);
    expect(mixed.exitCode).toBe(1);
    expect(mixed.stdout).toMatch(/^REJECTED\s+.*tampered\.json/m);
    expect(mixed.stdout).toMatch(/^UNREADABLE\s+.*garbage\.json/m);
    expect(mixed.stdout).toMatch(/1 verified, 1 rejected, 1 unreadable/);

    const json = await runCli(['check', file, '--json', '--digits', '60']);
    const report = JSON.parse(json.stdout).reports[0];
    expect(report.verdict).toBe('VERIFIED');
    expect(report.digits).toBeGreaterThanOrEqual(60);
    expect((await runCli(['check', file, '--digits', 'many'])).exitCode).toBe(2);
  });
});

describe('orbitseal demo', () => {
  it('demo --out DIR: proves and re-verifies both scenarios in a few seconds, exit 0', async () => {
    const out = fresh('demo');
    const t0 = performance.now();
    const r = await runCli(['demo', '--out', out]);
    const seconds = (performance.now() - t0) / 1000;
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/Orchard moth census/);
    // moth equilibrium K(1 − 1/r) = 12·2.83/3.83 ≈ 8.8668407 (closed form, derived by hand);
    // two 3-cycles for r = 3.83 > 1 + √8 (arXiv:1204.0546)
    expect(r.stdout).toMatch(/N ∈ \[8\.86684073\d*, 8\.86684073\d*\]/);
    // 2 + 2 moth orbits, 2 vole equilibria, 1 vole 2-cycle
    expect(r.stdout.match(/proven, re-verified/g)!.length).toBe(7);
    const files = readdirSync(out).filter((f) => f.endsWith('.json'));
    expect(files).toHaveLength(7);
    for (const f of files) {
      const cert = JSON.parse(readFileSync(join(out, f), 'utf8'));
      expect(validate(schema, cert), f).toEqual([]);
      expect(cert.sha256).toBe(certificateHash(cert));
    }
    expect(r.stdout).toContain(`orbitseal check ${out}`);
    expect(seconds).toBeLessThan(30);
  });

  it('demo --json: the vole 2-cycle contains the closed form and is attracting with |λ| = b = 0.3', async () => {
    const r = await runCli(['demo', '--out', fresh('demo-json'), '--json']);
    expect(r.exitCode).toBe(0);
    const doc = JSON.parse(r.stdout);
    const run = doc.runs.find((x: { scenario: string; period: number }) => x.scenario.startsWith('Alpine vole') && x.period === 2);
    // each run carries the exact parameters it used (the JSON envelope's map rule; the scenario's map file)
    expect(run.map.params).toEqual({ a: '0.6', b: '0.3' });
    expect(doc.runs.find((x: { scenario: string }) => x.scenario.startsWith('Orchard moth')).map.params).toEqual({ r: '3.83', K: '12' });
    const o = run.orbits[0];
    expect(o.status).toBe('verified');
    expect(o.class).toBe('attracting');
    // S = ((1 − b) ± √(4a − 3(1 − b)²))/(2a), a = 0.6, b = 0.3; det of the monodromy b² and
    // complex eigenvalues of modulus b (closed forms, derived by hand)
    const root = new D('0.93').sqrt();
    const sValues = [new D('0.7').minus(root).div('1.2'), new D('0.7').plus(root).div('1.2')];
    const boxS = o.boxes.map((b: string[][]) => b[0]);
    for (const sv of sValues) {
      expect(boxS.some((iv: string[]) => new D(iv[0]!).lte(sv) && sv.lte(iv[1]!)), sv.toString()).toBe(true);
    }
    const det = o.stability.determinant;
    expect(new D(det[0]).lte('0.09') && new D('0.09').lte(det[1])).toBe(true);
    for (const m of o.stability.eigenvalueModuli) expect(new D(m[0]).lte('0.3') && new D('0.3').lte(m[1])).toBe(true);
  });
});
