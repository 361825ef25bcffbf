/**
 * What the report renders: entries (one per file, with the independent checker's verdict and, when
 * the file is a readable certificate, its document) and the views a certificate kind contributes.
 */
import type { StabilityClass } from '../certificate/types.js';

export type ReportVerdict = 'VERIFIED' | 'REJECTED' | 'UNREADABLE';

/** One file of the report. `certificate` is set only when the checker said VERIFIED. */
export interface ReportEntry {
  /** Path as shown to the reader (relative to where the report was asked for). */
  file: string;
  verdict: ReportVerdict;
  /** The checker's reason when not VERIFIED. */
  reason?: string;
  /** JSON path of the offending value, when the checker gave one. */
  path?: string;
  claimsVerified: string[];
  /** The parsed certificate (any kind), present for VERIFIED entries only. */
  certificate?: { kind: string; [key: string]: unknown };
}

/** One figure: an SVG with its text alternative. */
export interface Plot {
  /** Unique in the report, usable as a file name stem. */
  id: string;
  /** Short title (also the SVG <title>). */
  title: string;
  /** What the plot shows, in words (SVG <desc> and the figure caption). */
  description: string;
  /** The whole <svg> element, with xmlns (a stand-alone file as it is). */
  svg: string;
  /** How many proof boxes / enclosures / cover leaves the plot draws (the DOM tests count them). */
  boxes: number;
  /** A wide plot (720 px, a parameter axis): its caption may be as wide. */
  wide?: boolean;
}

/** What a kind view returns for one verified certificate. */
export interface EntryView {
  /** Heading, e.g. "Orchard moth census — period 3". */
  heading: string;
  /** The claim in plain words (plain text; the HTML layer escapes it). */
  claim: string;
  /** Label → value lines (map formulas, parameters, enclosures). */
  facts: [string, string][];
  plots: Plot[];
  /** Tables shown after the facts (plain text cells; the HTML layer escapes them). */
  tables?: { caption: string; head: string[]; rows: string[][] }[];
  /** One row of the summary table. */
  summary: { map: string; what: string; parameters: string; stability: string };
}

/** A mark on a parameter diagram (bifurcation diagram of a 1-D map). */
export interface ParameterMark {
  /** Parameter interval (lo = hi for an exact value) and state interval, as plain floats. */
  theta: [number, number];
  x: [number, number];
  stability: StabilityClass | 'window' | 'edge';
  /** Tooltip text. */
  label: string;
  /**
   * How it is drawn: `box` (default) a proof box θ × x; `band` a shaded parameter band over the
   * whole height (a window's range, a gap of a window; `x` is ignored); `line` a vertical mark at
   * θ (an edge enclosure; `x` is ignored).
   */
  shape?: 'box' | 'band' | 'line';
  /** For bands: 'window' (proven range), 'gap' (nothing claimed), 'absence' (no orbit proven). */
  band?: 'window' | 'gap' | 'absence';
}

/** A 1-D map with a parameter: what the bifurcation diagram needs from one certificate. */
export interface ParameterDiagramInput {
  /** Identifies the map apart from the varied parameter (title, variable, formula, other params). */
  groupKey: string;
  title: string;
  variable: string;
  formula: string;
  /** Every parameter with its text value (exact "3.83" or "[lo, hi]"). */
  params: Record<string, string | [string, string]>;
  marks: (parameter: string) => ParameterMark[];
  /** @heuristic (x, θ) ↦ f_θ(x) in floats for the grey orbit diagram, or undefined. */
  family: (parameter: string) => ((x: number, theta: number) => number) | undefined;
}

/**
 * The extension point: each certificate kind registers one view (report/registry.ts). Later kinds
 * (window, edges, count, flows) add their own entry view and, optionally, marks on the bifurcation
 * diagram of a 1-D map.
 */
export interface KindView {
  kind: string;
  render(certificate: ReportEntry['certificate'] & object, entryId: string): EntryView;
  /** Present when the certificate can be placed on a parameter diagram (1-D maps with a parameter). */
  parameterDiagram?(certificate: ReportEntry['certificate'] & object): ParameterDiagramInput | undefined;
}
