import fc from 'fast-check';

/** The part of a JSON Schema (OpenAPI 3 / zod's toJSONSchema) the generators read. */
export interface Schema {
  $ref?: string;
  type?: string | string[];
  properties?: Record<string, Schema>;
  required?: string[];
  items?: Schema;
  enum?: unknown[];
  const?: unknown;
  anyOf?: Schema[];
  oneOf?: Schema[];
  allOf?: Schema[];
}

export type Resolve = (s: Schema) => Schema;

/** Follows "#/components/schemas/X" (and allOf of one) to the schema itself. */
export function resolver(components: Record<string, Schema>): Resolve {
  const resolve: Resolve = (s) => {
    if (s.$ref) return resolve(components[s.$ref.split('/').pop()!] ?? {});
    if (s.allOf?.length === 1) return resolve(s.allOf[0]!);
    return s;
  };
  return resolve;
}

const typeOf = (s: Schema): string | undefined => {
  if (s.const !== undefined) return typeof s.const;
  if (s.enum?.length) return typeof s.enum[0];
  return Array.isArray(s.type) ? s.type[0] : s.type;
};

/** A value of the schema's JSON type (not necessarily valid: ranges and formats are ignored). */
export function typed(s0: Schema, resolve: Resolve, depth = 0): fc.Arbitrary<unknown> {
  const s = resolve(s0);
  if (s.const !== undefined) return fc.constant(s.const);
  if (s.enum?.length) return fc.constantFrom(...s.enum);
  const alts = s.anyOf ?? s.oneOf;
  if (alts?.length) return fc.oneof(...alts.map((a) => typed(a, resolve, depth + 1)));
  switch (typeOf(s)) {
    case 'string':
      return fc.string({ maxLength: 40 });
    case 'number':
      return fc.double({ noNaN: true, noDefaultInfinity: true });
    case 'integer':
      return fc.integer();
    case 'boolean':
      return fc.boolean();
    case 'array':
      return depth > 3
        ? fc.constant([])
        : fc.array(typed(s.items ?? {}, resolve, depth + 1), { maxLength: 3 });
    case 'object':
      return depth > 3 ? fc.constant({}) : objectOf(s, resolve, depth + 1);
    default:
      return fc.jsonValue({ maxDepth: 2 });
  }
}

function objectOf(s: Schema, resolve: Resolve, depth: number): fc.Arbitrary<object> {
  const props = Object.entries(s.properties ?? {});
  return fc.record(Object.fromEntries(props.map(([k, v]) => [k, typed(v, resolve, depth)])), {
    requiredKeys: s.required ?? [],
  });
}

/** A value whose JSON type is not the schema's: a string where a number belongs, and so on. */
export function wrongTyped(s0: Schema, resolve: Resolve, form = false): fc.Arbitrary<unknown> {
  const s = resolve(s0);
  const t = s.anyOf || s.oneOf ? 'union' : typeOf(s);
  const all: Record<string, fc.Arbitrary<unknown>> = {
    string: fc.string({ minLength: 1, maxLength: 10 }).map((v) => `x${v}`),
    number: fc.double({ noNaN: true, noDefaultInfinity: true }),
    boolean: fc.boolean(),
    array: fc.array(fc.integer(), { maxLength: 3 }),
    object: fc.dictionary(fc.string({ maxLength: 5 }), fc.integer(), { maxKeys: 2 }),
  };
  // integers count as numbers; a union or an untyped field only refuses structure it cannot be
  const wrong = Object.entries(all)
    .filter(([k]) => k !== t && !(t === 'integer' && k === 'number'))
    // a multipart field given as a list is the same field repeated, which forms allow
    .filter(([k]) => !(form && t === 'string' && k === 'array'))
    .filter(([k]) => (t === 'union' || t === undefined ? k === 'object' || k === 'array' : true))
    .map(([, a]) => a);
  return fc.oneof(...wrong);
}

/** Names that no schema field has: extra fields, and keys for random objects. */
export const unknownKey = (known: string[]) =>
  fc
    .string({ minLength: 1, maxLength: 12 })
    .map((k) => `zz${k.replace(/[^A-Za-z0-9]/g, 'q')}`)
    .filter((k) => !known.includes(k));

export interface BodyCase {
  kind: 'random-json' | 'wrong-type' | 'missing-field' | 'extra-field';
  body: unknown;
  /** the field the refusal must name, where the case targets one */
  names?: string[];
}

/** Bodies that are invalid by construction, of four kinds, for an object schema. */
export function invalidBodies(
  schema: Schema,
  resolve: Resolve,
  form = false,
): fc.Arbitrary<BodyCase>[] {
  const s = resolve(schema);
  const props = s.properties ?? {};
  const keys = Object.keys(props);
  const required = s.required ?? [];
  const cases: fc.Arbitrary<BodyCase>[] = [
    // JSON that is not an object, or an object of unknown keys only (RFC 8259 values)
    fc
      .oneof(
        fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 4 }),
        fc.dictionary(unknownKey(keys), fc.jsonValue({ maxDepth: 2 }), { minKeys: 1, maxKeys: 4 }),
        fc.oneof(fc.string(), fc.double({ noNaN: true, noDefaultInfinity: true }), fc.boolean()),
      )
      .map((body) => ({ kind: 'random-json', body })),
  ];
  if (keys.length) {
    cases.push(
      fc.constantFrom(...keys).chain((field) =>
        fc
          .tuple(objectOf(s, resolve, 1), wrongTyped(props[field]!, resolve, form))
          .map(([base, bad]) => ({
            kind: 'wrong-type' as const,
            body: { ...base, [field]: bad },
            names: [field],
          })),
      ),
    );
  }
  if (required.length) {
    cases.push(
      fc
        .tuple(
          objectOf({ ...s, required: keys }, resolve, 1),
          fc.subarray(required, { minLength: 1 }),
        )
        .map(([full, drop]) => {
          const body: Record<string, unknown> = { ...full };
          for (const k of drop) delete body[k];
          return { kind: 'missing-field' as const, body, names: drop };
        }),
    );
  }
  cases.push(
    fc
      .tuple(objectOf({ ...s, required: keys }, resolve, 1), unknownKey(keys), fc.jsonValue())
      .map(([full, key, v]) => ({
        kind: 'extra-field' as const,
        body: { ...full, [key]: v },
        names: [key],
      })),
  );
  return cases;
}
