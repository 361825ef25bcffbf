/**
 * A tiny JSON Schema (draft 2020-12) validator for exactly the keywords
 * schema/certificate-v1.schema.json uses: type, const, enum, required, properties,
 * additionalProperties, items, minItems, maxItems, minLength, minProperties, pattern, minimum,
 * oneOf, $ref to "#/$defs/...". Unknown keywords throw, so the schema cannot silently outgrow it.
 */
type Schema = Record<string, unknown>;

const KNOWN = new Set([
  '$schema', '$id', 'title', 'description', '$defs', 'type', 'const', 'enum', 'required',
  'properties', 'additionalProperties', 'items', 'minItems', 'maxItems', 'minLength',
  'minProperties', 'pattern', 'minimum', 'oneOf', '$ref',
]);

function typeOk(t: string, v: unknown): boolean {
  switch (t) {
    case 'object': return typeof v === 'object' && v !== null && !Array.isArray(v);
    case 'array': return Array.isArray(v);
    case 'string': return typeof v === 'string';
    case 'integer': return typeof v === 'number' && Number.isInteger(v);
    case 'number': return typeof v === 'number';
    case 'boolean': return typeof v === 'boolean';
    case 'null': return v === null;
    default: throw new Error(`mini-schema: unknown type ${t}`);
  }
}

export function validate(root: Schema, value: unknown): string[] {
  const resolveRef = (ref: string): Schema => {
    const m = /^#\/\$defs\/(.+)$/.exec(ref);
    if (!m) throw new Error(`mini-schema: unsupported $ref ${ref}`);
    const def = (root.$defs as Record<string, Schema>)[m[1]!];
    if (!def) throw new Error(`mini-schema: missing $def ${ref}`);
    return def;
  };
  const walk = (s: Schema, v: unknown, path: string, errors: string[]): void => {
    for (const k of Object.keys(s)) if (!KNOWN.has(k)) throw new Error(`mini-schema: unsupported keyword ${k}`);
    if (typeof s.$ref === 'string') walk(resolveRef(s.$ref), v, path, errors);
    if (typeof s.type === 'string' && !typeOk(s.type, v)) {
      errors.push(`${path}: expected ${s.type}`);
      return;
    }
    if ('const' in s && JSON.stringify(s.const) !== JSON.stringify(v)) errors.push(`${path}: expected const ${JSON.stringify(s.const)}`);
    if (Array.isArray(s.enum) && !s.enum.some((e) => JSON.stringify(e) === JSON.stringify(v))) errors.push(`${path}: not in enum`);
    if (Array.isArray(s.oneOf)) {
      const passing = s.oneOf.filter((sub) => {
        const subErrors: string[] = [];
        walk(sub as Schema, v, path, subErrors);
        return subErrors.length === 0;
      }).length;
      if (passing !== 1) errors.push(`${path}: matches ${passing} of oneOf (need exactly 1)`);
    }
    if (typeof v === 'string') {
      if (typeof s.minLength === 'number' && v.length < s.minLength) errors.push(`${path}: shorter than ${s.minLength}`);
      if (typeof s.pattern === 'string' && !new RegExp(s.pattern, 'u').test(v)) errors.push(`${path}: does not match ${s.pattern}`);
    }
    if (typeof v === 'number' && typeof s.minimum === 'number' && v < s.minimum) errors.push(`${path}: below ${s.minimum}`);
    if (Array.isArray(v)) {
      if (typeof s.minItems === 'number' && v.length < s.minItems) errors.push(`${path}: fewer than ${s.minItems} items`);
      if (typeof s.maxItems === 'number' && v.length > s.maxItems) errors.push(`${path}: more than ${s.maxItems} items`);
      if (s.items && typeof s.items === 'object') v.forEach((item, i) => walk(s.items as Schema, item, `${path}[${i}]`, errors));
    }
    if (typeof v === 'object' && v !== null && !Array.isArray(v)) {
      const obj = v as Record<string, unknown>;
      if (Array.isArray(s.required)) for (const r of s.required as string[]) if (!(r in obj)) errors.push(`${path}: missing ${r}`);
      if (typeof s.minProperties === 'number' && Object.keys(obj).length < s.minProperties) errors.push(`${path}: fewer than ${s.minProperties} properties`);
      const props = (s.properties ?? {}) as Record<string, Schema>;
      for (const [k, val] of Object.entries(obj)) {
        if (k in props) walk(props[k]!, val, `${path}.${k}`, errors);
        else if (s.additionalProperties === false) errors.push(`${path}: unexpected property ${k}`);
        else if (typeof s.additionalProperties === 'object') walk(s.additionalProperties as Schema, val, `${path}.${k}`, errors);
      }
    }
  };
  const errors: string[] = [];
  walk(root, value, '$', errors);
  return errors;
}
