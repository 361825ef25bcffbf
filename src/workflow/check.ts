/**
 * `checkMany`: the `check` workflow over files and folders, on all cores. Same reports, in the same
 * order, as the checker's sequential `checkPaths` (the folder walk is the checker's own
 * `listCheckTargets`; each file is checked by `checkFile` in some worker).
 */
import { listCheckTargets, type CheckOptions, type CheckReport, type SkippedEntry } from '../checker/index.js';
import type { CheckTask } from './check-task.js';
import { runPool } from './pool.js';

export interface CheckManyOptions {
  digits?: number;
  /** Checker limits (e.g. `maxWork`), as `CheckOptions.limits`. */
  limits?: CheckOptions['limits'];
  /** Worker threads (default: the number of cores). */
  workers?: number;
  /** Finished certificates so far, across workers. */
  progress?: (done: number, total: number) => void;
  /** Each finished report as it arrives, with the count of finished certificates so far. */
  onReport?: (report: CheckReport, done: number, total: number) => void;
}

const CHECK_TASK = { module: new URL('./check-task.js', import.meta.url).href, exportName: 'checkTask' };

export async function checkMany(paths: string[], opts: CheckManyOptions = {}): Promise<CheckReport[]> {
  return (await checkManyReporting(paths, opts)).reports;
}

/** `checkMany` plus what the folder walk skipped (as the checker's `checkPathsReporting`). */
export async function checkManyReporting(paths: string[], opts: CheckManyOptions = {}): Promise<{ reports: CheckReport[]; skipped: SkippedEntry[] }> {
  const { targets, skipped } = listCheckTargets(paths, opts.digits !== undefined ? { digits: opts.digits } : {});
  const tasks: CheckTask[] = [];
  for (const t of targets) {
    if (typeof t === 'string') tasks.push({ file: t, ...(opts.digits !== undefined ? { digits: opts.digits } : {}), ...(opts.limits ? { limits: opts.limits } : {}) });
  }
  const checked = await runPool<CheckTask, CheckReport>(CHECK_TASK, tasks, {
    ...(opts.workers !== undefined ? { workers: opts.workers } : {}),
    ...(opts.progress !== undefined ? { progress: opts.progress } : {}),
    ...(opts.onReport !== undefined ? { onResult: opts.onReport } : {}),
  });
  let k = 0;
  return { reports: targets.map((t) => (typeof t === 'string' ? checked[k++]! : t)), skipped };
}
