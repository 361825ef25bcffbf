/** The pool task of `checkMany`: one certificate file (runs in a worker thread or inline). */
import { checkFile, type CheckOptions, type CheckReport } from '../checker/index.js';

export interface CheckTask {
  file: string;
  digits?: number;
  limits?: CheckOptions['limits'];
}

export function checkTask(t: CheckTask): CheckReport {
  return checkFile(t.file, { ...(t.digits !== undefined ? { digits: t.digits } : {}), ...(t.limits ? { limits: t.limits } : {}) });
}
