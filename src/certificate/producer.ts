/**
 * The producer name and version recorded in certificates, read at run time from the
 * package.json that ships with the compiled code (works from `src/` under vitest and from
 * `dist/src/` when installed globally or run through npx).
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const PRODUCER_NAME = 'orbitseal';

let cachedVersion: string | undefined;

/** Version of the orbitseal package this file belongs to ("0.0.0-unknown" if not found). */
export function packageVersion(): string {
  if (cachedVersion !== undefined) return cachedVersion;
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let depth = 0; depth < 6; depth++) {
    try {
      const pkg = JSON.parse(readFileSync(join(dir, 'package.json'), 'utf8')) as {
        name?: unknown;
        version?: unknown;
      };
      if (pkg.name === PRODUCER_NAME && typeof pkg.version === 'string') {
        cachedVersion = pkg.version;
        return cachedVersion;
      }
    } catch {
      // not here; look one folder up
    }
    const parent = dirname(dir);
    if (parent === dir) break;
    dir = parent;
  }
  cachedVersion = '0.0.0-unknown';
  return cachedVersion;
}
