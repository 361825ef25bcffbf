/**
 * Views by certificate `kind`: the report's extension point. A new certificate kind (window, edges,
 * count, flows, …) writes a `KindView` in a file of its own and registers it here; the HTML layer
 * looks views up by `certificate.kind` and shows "no view for this kind yet" otherwise.
 */
import type { KindView } from './types.js';
import { absenceView } from './absence.js';
import { countView } from './count.js';
import { edgeView } from './edge.js';
import { flowView } from './flow.js';
import { periodicOrbitView } from './periodic-orbit.js';
import { windowView } from './window.js';

const views = new Map<string, KindView>();

export function registerKindView(view: KindView): void {
  views.set(view.kind, view);
}

export function kindView(kind: string): KindView | undefined {
  return views.get(kind);
}

export function registeredKinds(): string[] {
  return [...views.keys()].sort();
}

for (const view of [periodicOrbitView, windowView, edgeView, absenceView, countView, flowView]) registerKindView(view);
