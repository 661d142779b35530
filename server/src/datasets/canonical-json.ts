import canonicalizeModule from 'canonicalize';

// The package is CommonJS (`module.exports = serialize`); its typings describe an ES default export.
const canonicalize = canonicalizeModule as unknown as (value: unknown) => string | undefined;

/** The RFC 8785 canonical JSON text of a value (no database or entity imports: workers use it). */
export function canonicalText(value: unknown): string {
  const canonical = canonicalize(value);
  if (canonical === undefined) throw new Error('The value has no JSON form.');
  return canonical;
}
