export type { EntryView, KindView, ParameterDiagramInput, ParameterMark, Plot, ReportEntry, ReportVerdict } from './types.js';
export { renderReportHtml, type RenderedReport, type ReportOptions } from './html.js';
export { registerKindView, kindView, registeredKinds } from './registry.js';
export { collectEntries, entriesFromReports } from './collect.js';
export { claimText } from './periodic-orbit.js';
