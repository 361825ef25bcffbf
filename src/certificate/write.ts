/**
 * Writing certificates: atomic (temp file in the same folder, fsync, then link/rename) and never
 * overwriting an existing file unless `force`.
 */
import { randomBytes } from 'node:crypto';
import {
  accessSync,
  closeSync,
  constants as fsConstants,
  existsSync,
  fsyncSync,
  linkSync,
  mkdirSync,
  openSync,
  readFileSync,
  renameSync,
  statSync,
  unlinkSync,
  writeSync,
} from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { UserError } from '../errors.js';
import type { CertificateV1 } from './types.js';

export type CertificateWriteErrorCode = 'cert-exists' | 'cert-write-failed';

/** A user-facing write problem (exit 2): where (the path), what, and how to fix it. */
export class CertificateWriteError extends UserError {
  override name = 'CertificateWriteError';
  declare readonly code: CertificateWriteErrorCode;
  constructor(code: CertificateWriteErrorCode, path: string, message: string, hint: string) {
    super(code, message, hint, path);
  }
  /** The file or folder concerned (the `place` of UserError). */
  get path(): string {
    return this.place;
  }
  /** `path: error [code]: message` — the path first, as compilers print it. */
  override render(): string {
    return `${this.place}: error [${this.code}]: ${this.message}\n  hint: ${this.hint}`;
  }
}

/**
 * "ENOENT: no such file or directory, mkdir '/x'" → "ENOENT (no such file or directory)": node's
 * message already starts with the code, so it is not repeated.
 */
export function describeFsError(e: unknown): string {
  const err = e as NodeJS.ErrnoException;
  const code = typeof err?.code === 'string' ? err.code : undefined;
  let text = typeof err?.message === 'string' ? err.message : String(e);
  if (code !== undefined && text.startsWith(`${code}: `)) text = text.slice(code.length + 2);
  text = text.replace(/, \w+ '[^']*'( -> '[^']*')?$/, '');
  return code !== undefined ? `${code} (${text})` : text;
}

function dirError(target: string, message: string): CertificateWriteError {
  return new CertificateWriteError(
    'cert-write-failed',
    target,
    message,
    'choose a folder you can write to with --out (it is created if its parent folder is writable)',
  );
}

/** The nearest ancestor of `dir` (itself included) that exists, and the missing levels below it. */
function splitExisting(dir: string): { existing: string; missing: string[] } {
  const missing: string[] = [];
  let cur = resolve(dir);
  for (;;) {
    if (existsSync(cur)) return { existing: cur, missing };
    missing.unshift(cur);
    const up = dirname(cur);
    if (up === cur) return { existing: cur, missing };
    cur = up;
  }
}

function checkWritableDir(existing: string, target: string): void {
  let isDir: boolean;
  try {
    isDir = statSync(existing).isDirectory();
  } catch (e) {
    throw dirError(target, `cannot use folder ${existing}: ${describeFsError(e)}`);
  }
  if (!isDir) throw dirError(target, `${existing} exists and is not a folder`);
  try {
    accessSync(existing, fsConstants.W_OK | fsConstants.X_OK);
  } catch {
    throw dirError(target, `folder ${existing} is not writable`);
  }
}

/**
 * Throws cert-write-failed unless `dir` is a writable folder or could be created (its nearest
 * existing ancestor is a writable folder). Creates nothing; for failing early, before long work.
 */
export function checkDirectoryUsable(dir: string): void {
  const target = resolve(dir);
  checkWritableDir(splitExisting(target).existing, target);
}

/**
 * Create `dir` and its missing parents one level at a time. Not `mkdirSync(recursive)`: that loops
 * forever on some pseudo file systems (e.g. under /proc on Linux, node 20). Throws cert-write-failed
 * with the folder and the system's reason.
 */
export function ensureDirectory(dir: string): void {
  const target = resolve(dir);
  const { existing, missing } = splitExisting(target);
  checkWritableDir(existing, target);
  for (const level of missing) {
    try {
      mkdirSync(level);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'EEXIST' && existsSync(level) && statSync(level).isDirectory()) continue;
      throw dirError(target, `cannot create folder ${level}: ${describeFsError(e)}`);
    }
  }
}

/** "Hénon map (classic)" → "henon-map-classic"; at most 48 characters; never empty. */
export function mapSlug(title: string): string {
  const slug = title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 48)
    .replace(/-+$/g, '');
  return slug === '' ? 'map' : slug;
}

/**
 * `<map-slug>[-<name><value>…]-p<period>-<k>.json`, k >= 1 numbering the orbits of one run. The
 * parameters given on the command line (`params`, name → "3.83" or [lo, hi]) are part of the
 * name, so runs at r = 3.83 and r = 3.9 do not collide: `logistic-map-r3.83-p3-1.json`.
 */
export function certificateFileName(title: string, period: number, k: number, params: Record<string, string | readonly [string, string]> = {}): string {
  const tag = Object.keys(params)
    .sort()
    .map((name) => {
      const v = params[name]!;
      const text = typeof v === 'string' ? v : `${v[0]}_${v[1]}`;
      return `-${name}${text}`.replace(/[^A-Za-z0-9._+-]/g, '_');
    })
    .join('')
    .slice(0, 80);
  return `${mapSlug(title)}${tag}-p${period}-${k}.json`;
}

/** The bytes written for a certificate: pretty JSON (2 spaces) and a final newline. */
export function serializeCertificate(cert: CertificateV1): string {
  return JSON.stringify(cert, null, 2) + '\n';
}

export interface WriteOptions {
  /** Replace an existing file (default false: refuse with cert-exists). */
  force?: boolean;
  /**
   * Defer the folder fsync to `dirSync.flush()` (once per folder per batch) instead of once per
   * file. The file's own data is still fsynced before it gets its name, so a reader or a crash
   * never sees a half-written certificate; until the flush a crash may lose a NAME (the file is
   * then absent, never partial). Callers flush before they report the batch as written.
   */
  dirSync?: DirectorySync;
}

/**
 * The folders a batch of atomic writes still owes an fsync (see `WriteOptions.dirSync`).
 * `flush()` syncs each once and forgets them; it never throws (like the per-file folder sync,
 * a platform that cannot fsync a folder is not an error).
 */
export class DirectorySync {
  private readonly pending = new Set<string>();
  /** `sync` is replaceable for tests (counting calls); default: open + fsync + close. */
  constructor(private readonly sync: (dir: string) => void = fsyncDir) {}
  add(dir: string): void {
    this.pending.add(resolve(dir));
  }
  /** Number of folders waiting for their fsync. */
  get size(): number {
    return this.pending.size;
  }
  flush(): void {
    for (const d of this.pending) this.sync(d);
    this.pending.clear();
  }
}

function fsyncDir(dir: string): void {
  try {
    const fd = openSync(dir, 'r');
    try {
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
  } catch {
    // some platforms cannot fsync a directory; the data itself is already synced
  }
}

/**
 * Write `text` to `path` atomically: a reader sees either no file / the old file, or the whole new
 * file. Without `force` an existing file is never replaced (hard link, which fails on EEXIST,
 * so there is no check-then-write race; falls back to check + rename where links are not
 * supported). Creates the folder if needed. Returns the absolute path.
 */
export function writeFileAtomic(path: string, text: string, opts: WriteOptions = {}): string {
  const target = resolve(path);
  const dir = dirname(target);
  const existsError = () =>
    new CertificateWriteError(
      'cert-exists',
      target,
      'file already exists; not overwritten',
      'pass --force to replace it, or choose another folder with --out',
    );
  if (!opts.force && existsSync(target)) {
    // the same bytes again (an identical re-run) are not an error: nothing to write
    if (sameContent(target, text)) return target;
    throw existsError();
  }
  ensureDirectory(dir);
  const tmp = join(dir, `.${basename(target)}.${process.pid}.${randomBytes(6).toString('hex')}.tmp`);
  try {
    const fd = openSync(tmp, 'wx', 0o644);
    try {
      const buf = Buffer.from(text, 'utf8');
      let off = 0;
      while (off < buf.length) off += writeSync(fd, buf, off, buf.length - off);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    if (opts.force) {
      renameSync(tmp, target);
    } else {
      try {
        linkSync(tmp, target);
        unlinkSync(tmp);
      } catch (e) {
        const code = (e as NodeJS.ErrnoException).code;
        if (code === 'EEXIST') throw existsError();
        if (code !== 'EPERM' && code !== 'ENOTSUP' && code !== 'EOPNOTSUPP' && code !== 'EXDEV') throw e;
        if (existsSync(target)) throw existsError();
        renameSync(tmp, target);
      }
    }
    if (opts.dirSync !== undefined) opts.dirSync.add(dir);
    else fsyncDir(dir);
    return target;
  } catch (e) {
    try {
      unlinkSync(tmp);
    } catch {
      // already renamed or never created
    }
    if (e instanceof CertificateWriteError) throw e;
    throw new CertificateWriteError(
      'cert-write-failed',
      target,
      `cannot write file: ${describeFsError(e)}`,
      'check that the folder exists or can be created and is writable, or choose another with --out',
    );
  }
}

function sameContent(path: string, text: string): boolean {
  try {
    return statSync(path).size === Buffer.byteLength(text, 'utf8') && readFileSync(path, 'utf8') === text;
  } catch {
    return false;
  }
}

/** Write one certificate atomically; see writeFileAtomic. */
export function writeCertificate(path: string, cert: CertificateV1, opts: WriteOptions = {}): string {
  return writeFileAtomic(path, serializeCertificate(cert), opts);
}
