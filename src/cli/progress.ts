/**
 * Live progress of long phases on one terminal line: phase, count, rate and time left, e.g.
 * "search  12000/16384 seeds · 8400/s · ~1 s left". The CLI feeds it from workflow progress
 * callbacks; main.ts gives a sink only when stderr is a terminal, so pipes and files stay clean.
 */

/** Where progress text goes ("\r…" overwrites the line); absent: no progress. */
export type ProgressSink = (text: string) => void;

/** A short duration: "0.4 s", "12 s", "3 min 5 s", "2 h 4 min". */
export function shortDuration(ms: number): string {
  if (!Number.isFinite(ms) || ms < 0) return '?';
  const s = ms / 1000;
  if (s < 10) return `${s.toFixed(1)} s`;
  if (s < 60) return `${Math.round(s)} s`;
  const m = Math.floor(s / 60);
  if (m < 60) return `${m} min ${Math.round(s - 60 * m)} s`;
  return `${Math.floor(m / 60)} h ${m % 60} min`;
}

/** One progress line (pure): at most `width − 1` characters, nothing after the time left. */
export function progressText(phase: string, done: number, total: number, unit: string, elapsedMs: number, width: number, detail = ''): string {
  const parts = [`${phase}  ${done}/${total} ${unit}`];
  if (elapsedMs > 0 && done > 0) {
    const rate = (done * 1000) / elapsedMs;
    parts.push(rate >= 10 ? `${Math.round(rate)}/s` : `${rate.toPrecision(2)}/s`);
    if (done < total) parts.push(`~${shortDuration(((total - done) / rate) * 1000)} left`);
  }
  let line = parts.join(' · ');
  if (detail) line += `  ${detail}`;
  const max = Math.max(10, width - 1);
  return line.length > max ? line.slice(0, max - 1) + '…' : line;
}

export interface Progress {
  /** Report `done` of `total` in `phase` (throttled to ~10 updates a second, always the last). */
  update(phase: string, done: number, total: number, unit: string, detail?: string): void;
  /** Clear the line (call before printing results). */
  finish(): void;
}

/** A progress line on `sink`; a no-op when `sink` is absent. `now` is injectable for tests. */
export function createProgress(sink: ProgressSink | undefined, width = 80, now: () => number = () => performance.now()): Progress {
  if (!sink) return { update() {}, finish() {} };
  let phaseStart = now();
  let phaseName = '';
  let last = -Infinity;
  let shown = false;
  return {
    update(phase, done, total, unit, detail) {
      const t = now();
      if (phase !== phaseName) {
        phaseName = phase;
        phaseStart = t;
        last = -Infinity;
      }
      if (t - last < 100 && done < total) return;
      last = t;
      shown = true;
      sink(`\r\x1b[K${progressText(phase, done, total, unit, t - phaseStart, width, detail)}`);
    },
    finish() {
      if (shown) sink('\r\x1b[K');
      shown = false;
    },
  };
}
