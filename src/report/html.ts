/**
 * The report as one self-contained HTML page: inline CSS and SVG, no script, no external resource
 * (a Content-Security-Policy forbids any), so it opens offline and can be mailed or archived.
 * A pure function of the entries; views come from the registry by certificate kind.
 */
import { bifurcationPlot } from './plots.js';
import { kindView } from './registry.js';
import { esc, padRange } from './svg.js';
import type { EntryView, ParameterDiagramInput, Plot, ReportEntry } from './types.js';

export interface ReportOptions {
  /** Page title (default "orbitseal report"). */
  title?: string;
  /** "orbitseal 0.1.0", shown in the footer. */
  producer?: string;
}

export interface RenderedReport {
  html: string;
  /** Every plot of the page, in page order (for `--svg`). */
  plots: Plot[];
}

const CSS = `
body{font-family:system-ui,-apple-system,"Segoe UI",sans-serif;color:#111;background:#fff;margin:0 auto;max-width:1120px;padding:16px;line-height:1.45}
h1{font-size:1.5rem;margin:.2em 0}h2{font-size:1.2rem;margin:1.6em 0 .4em;border-bottom:2px solid #111}h3{font-size:1.05rem}
.note{color:#333;font-size:.92rem}
code,h3,a,p,figcaption{overflow-wrap:anywhere}
dl.facts dt{overflow-wrap:anywhere}
.table-wrap{overflow-x:auto}
table{border-collapse:collapse;font-size:.9rem;width:100%}table.kind-table{margin:.6em 0;width:auto}th,td{border:1px solid #999;padding:4px 6px;text-align:left;vertical-align:top}th{background:#eee}
.verdict{font-weight:700;white-space:nowrap}.verdict-VERIFIED{color:#14532d}.verdict-REJECTED,.verdict-UNREADABLE{color:#8b0000}
.claim{background:#f4f4f4;border-left:4px solid #111;padding:8px 12px}
dl.facts{display:grid;grid-template-columns:minmax(0,max-content) minmax(0,1fr);gap:2px 12px;font-size:.88rem}dl.facts dt{font-weight:600}dl.facts dd{margin:0;overflow-wrap:anywhere;font-family:ui-monospace,monospace}
.plots{display:flex;flex-wrap:wrap;gap:16px}figure{margin:0;max-width:100%;min-width:0;flex:0 1 auto}figure svg{max-width:100%;height:auto;border:1px solid #ccc}
figcaption{font-size:.82rem;max-width:360px;color:#333}figure.wide figcaption{max-width:720px}
section.certificate{border-top:1px solid #bbb;padding-top:4px}
@media print{section.certificate{break-inside:avoid}}
`;

interface Rendered {
  entry: ReportEntry;
  id: string;
  view?: EntryView;
  diagram?: ParameterDiagramInput;
  noView?: string;
}

function figure(p: Plot, wide = p.wide === true): string {
  return `<figure${wide ? ' class="wide"' : ''} data-plot="${esc(p.id)}" data-boxes="${p.boxes}">${p.svg}<figcaption>${esc(p.title)}. ${esc(p.description)}</figcaption></figure>`;
}

function verdictCell(e: ReportEntry): string {
  const mark = e.verdict === 'VERIFIED' ? '✓' : '✗';
  return `<span class="verdict verdict-${e.verdict}">${mark} ${e.verdict}</span>`;
}

/** Group the 1-D certificates with a parameter into bifurcation diagrams. */
function diagrams(rendered: Rendered[]): { plot: Plot; parameter: string; members: Rendered[]; heading: string }[] {
  const groups = new Map<string, Rendered[]>();
  for (const r of rendered) {
    if (!r.diagram) continue;
    const list = groups.get(r.diagram.groupKey) ?? [];
    list.push(r);
    groups.set(r.diagram.groupKey, list);
  }
  const out: { plot: Plot; parameter: string; members: Rendered[]; heading: string }[] = [];
  let k = 0;
  for (const members of groups.values()) {
    const first = members[0]!.diagram!;
    const names = Object.keys(first.params);
    const text = (d: ParameterDiagramInput, n: string) => JSON.stringify(d.params[n]);
    const varying = names.filter((n) => members.some((m) => text(m.diagram!, n) !== text(first, n)));
    if (varying.length > 1) continue; // not one family along one parameter
    const parameter = varying[0] ?? names[0]!;
    const marks = members.flatMap((m) => m.diagram!.marks(parameter));
    let tlo = Infinity;
    let thi = -Infinity;
    let xlo = Infinity;
    let xhi = -Infinity;
    for (const m of marks) {
      tlo = Math.min(tlo, m.theta[0]);
      thi = Math.max(thi, m.theta[1]);
      xlo = Math.min(xlo, m.x[0]);
      xhi = Math.max(xhi, m.x[1]);
    }
    let thetaRange: [number, number];
    if (thi - tlo > 0) thetaRange = [tlo - (thi - tlo) * 0.06, thi + (thi - tlo) * 0.06];
    else {
      const d = Math.max(Math.abs(tlo) * 0.05, 0.05);
      thetaRange = [tlo - d, thi + d];
    }
    const xRange = padRange(xlo, xhi, 0.06);
    const heading = `${first.title}, ${first.variable}' = ${first.formula}, along ${parameter}`;
    const plot = bifurcationPlot(`bifurcation-${++k}`, first.variable, parameter, thetaRange, xRange, first.family(parameter), marks, heading);
    out.push({ plot, parameter, members, heading });
  }
  return out;
}

/** The whole page. Entries are shown in the given order. */
export function renderReportHtml(entries: readonly ReportEntry[], opts: ReportOptions = {}): RenderedReport {
  const title = opts.title ?? 'orbitseal report';
  const rendered: Rendered[] = entries.map((entry, i) => {
    const id = `cert-${i + 1}`;
    const r: Rendered = { entry, id };
    if (entry.verdict === 'VERIFIED' && entry.certificate) {
      // the edge and absence views draw one-dimensional maps; det(M ∓ I) edges and box covers of n ≥ 2 have none yet
      const dim = (entry.certificate as { map?: { state?: unknown[] } }).map?.state?.length ?? 1;
      const oneDimOnly = (entry.certificate.kind === 'bifurcation-edge' || entry.certificate.kind === 'periodic-absence') && dim !== 1;
      const view = oneDimOnly ? undefined : kindView(entry.certificate.kind);
      if (view) {
        r.view = view.render(entry.certificate, id);
        const d = view.parameterDiagram?.(entry.certificate);
        if (d) r.diagram = d;
      } else r.noView = oneDimOnly ? `no view for ${entry.certificate.kind} certificates of ${dim}-dimensional maps yet` : `no view for certificate kind “${entry.certificate.kind}” yet`;
    }
    return r;
  });
  const plots: Plot[] = [];
  const count = (v: ReportEntry['verdict']) => entries.filter((e) => e.verdict === v).length;

  const body: string[] = [];
  body.push(`<header><h1>${esc(title)}</h1>`);
  body.push(
    `<p class="summary-line">${entries.length} file${entries.length === 1 ? '' : 's'}: ${count('VERIFIED')} verified, ${count('REJECTED')} rejected, ${count('UNREADABLE')} unreadable (independent checker, decimal interval arithmetic, run when this report was made).</p>`,
  );
  body.push(
    `<p class="note">Each claim below is stated only for certificates the independent checker VERIFIED. Plots are drawn in floating point from the certificates: the proofs are the decimal interval ends in the files, not the pictures. Proof boxes are often far smaller than a pixel; they are drawn at a visible minimum size around their true place.</p></header>`,
  );

  body.push('<h2 id="summary">Summary</h2><div class="table-wrap"><table class="summary"><caption class="note">One row per file, in the order given.</caption>');
  body.push('<thead><tr><th scope="col">#</th><th scope="col">certificate</th><th scope="col">map</th><th scope="col">what</th><th scope="col">parameters</th><th scope="col">stability</th><th scope="col">check</th></tr></thead><tbody>');
  rendered.forEach((r, i) => {
    const s = r.view?.summary;
    body.push(
      `<tr data-cert="${r.id}"><td>${i + 1}</td><td><a href="#${r.id}">${esc(r.entry.file)}</a></td><td>${esc(s?.map ?? '—')}</td><td>${esc(s?.what ?? '—')}</td>` +
        `<td>${esc(s?.parameters ?? '—')}</td><td>${esc(s?.stability ?? '—')}</td><td>${verdictCell(r.entry)}</td></tr>`,
    );
  });
  body.push('</tbody></table></div>');

  const diags = diagrams(rendered);
  if (diags.length > 0) {
    body.push('<h2 id="bifurcation">Bifurcation diagrams</h2>');
    for (const d of diags) {
      plots.push(d.plot);
      body.push(`<section class="bifurcation" data-members="${d.members.map((m) => m.id).join(' ')}"><h3>${esc(d.heading)}</h3>`);
      body.push(`<div class="plots">${figure(d.plot, true)}</div>`);
      body.push(`<p class="note">Certificates on it: ${d.members.map((m) => `<a href="#${m.id}">${esc(m.view!.heading)}</a>`).join('; ')}.</p></section>`);
    }
  }

  body.push('<h2 id="certificates">Certificates</h2>');
  for (const r of rendered) {
    const e = r.entry;
    body.push(`<section class="certificate" id="${r.id}" data-verdict="${e.verdict}" data-kind="${esc(e.certificate?.kind ?? '')}" data-file="${esc(e.file)}">`);
    body.push(`<h3>${esc(r.view?.heading ?? e.file)} ${verdictCell(e)}</h3>`);
    body.push(`<p class="note">File: <code>${esc(e.file)}</code></p>`);
    if (e.verdict !== 'VERIFIED') {
      body.push(
        `<p class="claim">Nothing in this file is proven: the independent checker said ${e.verdict}${e.path ? ` at <code>${esc(e.path)}</code>` : ''}: ${esc(e.reason ?? 'no reason given')}.</p>`,
      );
    } else if (r.noView) {
      body.push(`<p class="claim">Verified (${esc(e.claimsVerified.join(', '))}); ${esc(r.noView)}.</p>`);
    } else if (r.view) {
      const v = r.view;
      body.push(`<p class="claim">${esc(v.claim)}</p>`);
      body.push(`<p class="note">Re-verified claims: ${esc(e.claimsVerified.join(', '))}.</p>`);
      body.push('<dl class="facts">' + v.facts.map(([k, val]) => `<dt>${esc(k)}</dt><dd>${esc(val)}</dd>`).join('') + '</dl>');
      for (const t of v.tables ?? []) {
        body.push(
          `<div class="table-wrap"><table class="kind-table"><caption class="note">${esc(t.caption)}</caption><thead><tr>${t.head.map((h) => `<th scope="col">${esc(h)}</th>`).join('')}</tr></thead><tbody>` +
            t.rows.map((r) => `<tr>${r.map((c) => `<td>${esc(c)}</td>`).join('')}</tr>`).join('') +
            '</tbody></table></div>',
        );
      }
      body.push(`<div class="plots">${v.plots.map((p) => figure(p)).join('')}</div>`);
      plots.push(...v.plots);
    }
    body.push('</section>');
  }
  body.push(`<footer class="note"><p>Made by ${esc(opts.producer ?? 'orbitseal')}. This page loads nothing from the network and runs no script.</p></footer>`);

  const html =
    '<!doctype html>\n<html lang="en"><head><meta charset="utf-8">' +
    `<meta name="viewport" content="width=device-width, initial-scale=1">` +
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'">` +
    `<title>${esc(title)}</title><style>${CSS}</style></head><body>\n` +
    body.join('\n') +
    '\n</body></html>\n';
  return { html, plots };
}
