/**
 * Canonical JSON and the certificate hash (docs/certificate-format.md).
 *
 * Canonical form: object keys sorted by UTF-16 code units (the default `Array.prototype.sort`
 * order), no whitespace, strings and numbers exactly as `JSON.stringify` writes them, object
 * members whose value is `undefined` omitted (as `JSON.stringify` does), arrays kept in order.
 * The hash is SHA-256 (lower-case hex) of the UTF-8 bytes of the canonical JSON of the document
 * without its top-level "sha256" key.
 */
import { createHash } from 'node:crypto';

/** Canonical JSON of a JSON value (objects, arrays, strings, finite numbers, booleans, null). */
export function canonicalJson(value: unknown): string {
  if (value === null) return 'null';
  switch (typeof value) {
    case 'string':
    case 'boolean':
      return JSON.stringify(value);
    case 'number':
      if (!Number.isFinite(value)) throw new TypeError(`canonicalJson: non-finite number ${value}`);
      return JSON.stringify(value);
    case 'object': {
      if (Array.isArray(value)) {
        return '[' + value.map((v) => (v === undefined ? 'null' : canonicalJson(v))).join(',') + ']';
      }
      const obj = value as Record<string, unknown>;
      const keys = Object.keys(obj).filter((k) => obj[k] !== undefined).sort();
      return '{' + keys.map((k) => JSON.stringify(k) + ':' + canonicalJson(obj[k])).join(',') + '}';
    }
    default:
      throw new TypeError(`canonicalJson: unsupported value of type ${typeof value}`);
  }
}

/** SHA-256 hex of the canonical JSON of `doc` with its top-level "sha256" key removed. */
export function certificateHash(doc: object): string {
  const { sha256: _omit, ...rest } = doc as Record<string, unknown>;
  return createHash('sha256').update(canonicalJson(rest), 'utf8').digest('hex');
}

/** True when `doc.sha256` equals the recomputed hash. */
export function hasValidHash(doc: object): boolean {
  const claimed = (doc as Record<string, unknown>).sha256;
  return typeof claimed === 'string' && claimed === certificateHash(doc);
}
