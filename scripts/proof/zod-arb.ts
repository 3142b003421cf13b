// fast-check arbitraries driven by the shared zod contract: well-formed values, and payloads that break them.
import fc from 'fast-check';
/** A zod schema; only its internal definition is read, so no zod import is needed here. */
type ZodSchema = object;

type Any = ZodSchema;
interface Def {
  type: string;
  [k: string]: unknown;
}
const defOf = (s: Any) => (s as unknown as { _zod: { def: Def; optin?: string } })._zod.def;
/** The checks on a schema (length bounds, patterns, refinements), as zod keeps them. */
const checksOf = (s: Any) => ((defOf(s).checks ?? []) as { _zod: { def: Record<string, unknown> } }[]).map((c) => c._zod.def);
const patternOf = (s: Any) => checksOf(s).find((c) => c.pattern)?.pattern as RegExp | undefined;
const parses = (s: Any, v: unknown) => (s as { safeParse(v: unknown): { success: boolean } }).safeParse(v).success;
const isOptional = (s: Any) => (s as unknown as { _zod: { optin?: string } })._zod.optin === 'optional';

/** Ids of real rows by the field name that carries them (customerId, boardId, ...): set before generating. */
export const realIds: Record<string, unknown[]> = {};

/**
 * Values by field name: a list of real values is mixed with the schema's own (four in five from the list); an
 * arbitrary is the field's only source, for fields whose valid values depend on each other or on a row.
 */
export type Ids = Record<string, unknown[] | fc.Arbitrary<unknown>>;

const safeChars = fc.constantFrom(...'abcdefghijklmnopqrstuvwxyz0123456789-'.split(''));
const safeLetters = fc.constantFrom(...'abcdefghijklmnopqrstuvwxyz0123456789'.split(''));

/** Values the schema's shape accepts (constraints beyond the shape, such as refinements, may still refuse them). */
export function validArb(schema: Any, depth = 0, ids: Ids = realIds): fc.Arbitrary<unknown> {
  const def = defOf(schema);
  const s = schema as unknown as Record<string, unknown>;
  switch (def.type) {
    case 'string': {
      const format = s.format as string | null;
      if (format === 'datetime') return fc.date({ min: new Date('2020-01-01'), max: new Date('2030-01-01'), noInvalidDate: true }).map((d) => d.toISOString());
      // the contract's e-mail check is stricter than RFC 5322 (no quoted or exotic local parts): addresses it takes
      if (format === 'email')
        return fc
          .tuple(fc.string({ unit: safeLetters, minLength: 1, maxLength: 12 }), fc.string({ unit: safeLetters, minLength: 1, maxLength: 12 }))
          .map(([a, b]) => `${a}@${b}.test`);
      if (format === 'uuid') return fc.uuid();
      if (format === 'url') return fc.webUrl();
      // The schema's own pattern: values a `^\d{1,3}(\.\d{1,3})?$` tax rate or a quantity accepts, not a made-up
      // shape; with a rule beyond the pattern (a tax rate of at most 100 %), only the pattern's values it takes.
      if (format === 'regex') {
        const pattern = patternOf(schema);
        if (!pattern) return fc.nat(999).map((n) => `TP${n}`);
        const refined = checksOf(schema).some((c) => c.check === 'custom');
        return fc.stringMatching(pattern).filter((v) => v.trim() === v && (!refined || parses(schema, v)));
      }
      const min = Math.max(1, Number(s.minLength ?? 1));
      const max = Math.max(min, Math.min(Number(s.maxLength ?? 40), 40));
      return fc.string({ unit: safeChars, minLength: Math.min(min, max), maxLength: max });
    }
    case 'number': {
      const min = Number.isFinite(s.minValue as number) ? (s.minValue as number) : -1e6;
      const max = Number.isFinite(s.maxValue as number) ? (s.maxValue as number) : 1e6;
      const lo = s.isInt ? Math.ceil(Math.max(min, -1e9)) : min;
      const hi = s.isInt ? Math.floor(Math.min(max, 1e9)) : max;
      const full = s.isInt ? fc.integer({ min: lo, max: hi }) : fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
      // Mostly everyday sizes: a sum of several fields at the top of their range breaks a rule on the sum (a
      // quote's total), and the rules beyond the sum are what the valid space is for; the edges still come.
      const [smallLo, smallHi] = [Math.max(lo, -1000), Math.min(hi, 10_000)];
      if (smallLo > smallHi) return full;
      const small = s.isInt ? fc.integer({ min: smallLo, max: smallHi }) : fc.double({ min: smallLo, max: smallHi, noNaN: true });
      return fc.oneof({ weight: 3, arbitrary: small }, { weight: 1, arbitrary: full });
    }
    case 'int':
      return fc.integer({ min: 0, max: 1000 });
    case 'boolean':
      return fc.boolean();
    case 'enum':
      return fc.constantFrom(...Object.values(def.entries as Record<string, string>));
    case 'literal':
      return fc.constantFrom(...(def.values as unknown[]));
    case 'array': {
      const bound = (kind: string) => checksOf(schema).find((c) => c.check === kind)?.[kind === 'min_length' ? 'minimum' : 'maximum'];
      const minLength = Math.min(Number(bound('min_length') ?? 0), 3);
      const maxLength = Math.max(minLength, Math.min(Number(bound('max_length') ?? 3), 3));
      if (depth > 4) return fc.constant([]);
      const items = fc.array(validArb(def.element as Any, depth + 1, ids), { minLength, maxLength });
      // a rule over the whole list (a quote's lines add up to less than the money range): the lists it takes
      return checksOf(schema).some((c) => c.check === 'custom') ? items.filter((v) => parses(schema, v)) : items;
    }
    case 'object': {
      const shape = def.shape as Record<string, Any>;
      const model: Record<string, fc.Arbitrary<unknown>> = {};
      const required: string[] = [];
      for (const [k, v] of Object.entries(shape)) {
        const real = ids[k];
        model[k] =
          real instanceof fc.Arbitrary
            ? real
            : real?.length
              ? fc.oneof({ weight: 4, arbitrary: fc.constantFrom(...real) }, { weight: 1, arbitrary: validArb(v, depth + 1, ids) })
              : validArb(v, depth + 1, ids);
        if (!isOptional(v)) required.push(k);
      }
      return fc.record(model, { requiredKeys: required as never[] });
    }
    case 'union':
      return fc.oneof(...(def.options as Any[]).map((o) => validArb(o, depth + 1, ids)));
    case 'nullable':
      return fc.oneof(fc.constant(null), validArb(def.innerType as Any, depth, ids));
    case 'optional':
    case 'default':
    case 'prefault':
    case 'readonly':
    case 'catch':
      return validArb(def.innerType as Any, depth, ids);
    case 'pipe':
      return validArb(def.in as Any, depth, ids);
    case 'record':
      return depth > 3
        ? fc.constant({})
        : fc.dictionary(fc.string({ unit: safeChars, minLength: 1, maxLength: 8 }), validArb(def.valueType as Any, depth + 1, ids), { maxKeys: 3 });
    case 'unknown':
    case 'any':
      return fc.jsonValue({ maxDepth: 2 });
    default:
      return fc.constant(null);
  }
}

/** Marks where raw JSON text is spliced in after stringify (deep nesting cannot go through JSON.stringify cheaply). */
const DEEP = (n: number) => `\u0001DEEP${n}\u0001`;

export const nastyValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom<unknown>(
    null,
    true,
    0,
    -1,
    -0,
    1e308,
    -1e308,
    5e-324,
    2 ** 53 + 1,
    '',
    '   ',
    'OL',
    'NaN',
    'Infinity',
    '1e400',
    [],
    {},
    [[[[]]]],
    '\u0000',
    '\ud800',
    '\u202e\u200b',
    '💥'.repeat(60),
    'x'.repeat(101),
    'x'.repeat(501),
    'y'.repeat(200_000),
    "'; DROP TABLE readings; --",
    '../../../../etc/passwd',
    { $gt: '' },
    { toString: 'x', valueOf: 1 },
    '2026-13-45T99:99:99Z',
    DEEP(64),
    DEEP(3000),
  ),
  fc.string({ unit: 'binary', maxLength: 300 }),
  fc.double(),
  fc.bigInt({ min: -(10n ** 30n), max: 10n ** 30n }).map((b) => Number(b)),
  fc.anything({ maxDepth: 3 }),
);

export interface FuzzPayload {
  text: string;
  contentType: string | null;
  contentEncoding?: string;
  label: string;
}

const contentTypes = fc.constantFrom<{ type: string | null; encoding?: string }>(
  { type: 'application/json' },
  { type: 'application/json' },
  { type: 'application/json' },
  { type: 'application/json' },
  { type: 'text/plain' },
  { type: 'application/x-www-form-urlencoded' },
  { type: 'multipart/form-data; boundary=xyz' },
  { type: 'application/json; charset=utf-16' },
  { type: 'application/xml' },
  { type: null },
  { type: 'application/json', encoding: 'gzip' },
  { type: 'application/json', encoding: 'br' },
);

function spliceDeep(text: string): string {
  return text.replace(/"\\u0001DEEP(\d+)\\u0001"/g, (_m, n: string) => '['.repeat(Number(n)) + ']'.repeat(Number(n)));
}

const PROTO_PREFIXES = [
  '"__proto__":{"role":"admin","shopId":"shop-other","isAdmin":true}',
  '"constructor":{"prototype":{"role":"admin","polluted":true}}',
  '"__proto__":null',
];

function stringifySafe(v: unknown): string {
  try {
    return JSON.stringify(v) ?? 'null';
  } catch {
    return 'null';
  }
}

/** Malformed and boundary bodies for one schema (and a share of well-formed ones, so boundaries get through). */
export function payloadArb(schema: Any, ids: Ids = realIds, valid: fc.Arbitrary<unknown> = validArb(schema, 0, ids)): fc.Arbitrary<FuzzPayload> {
  const def = defOf(schema);
  return payloadArbOf(valid, def.type === 'object' ? Object.keys(def.shape as object) : []);
}

/** The same mix for a body no contract schema describes (a payment event): well-formed values and their breakages. */
export function payloadArbOf(valid: fc.Arbitrary<unknown>, keys: string[]): fc.Arbitrary<FuzzPayload> {
  const mutated = fc.tuple(valid, fc.nat(), nastyValue, fc.constantFrom('replace', 'drop', 'extra')).map(([v, i, bad, how]) => {
    const obj = v && typeof v === 'object' && !Array.isArray(v) ? { ...(v as Record<string, unknown>) } : {};
    const key = keys.length ? keys[i % keys.length]! : 'x';
    if (how === 'replace') obj[key] = bad;
    else if (how === 'drop') delete obj[key];
    else obj[`extra_${i % 5}`] = bad;
    return { value: obj as unknown, label: `${how} ${key}` };
  });
  const body = fc.oneof(
    { weight: 5, arbitrary: mutated },
    // well-formed bodies reach the routes' own rules and state changes, not only the contract's refusals
    { weight: 12, arbitrary: valid.map((value) => ({ value, label: 'well-formed' })) },
    { weight: 2, arbitrary: nastyValue.map((value) => ({ value, label: 'whole body' })) },
    {
      weight: 2,
      arbitrary: fc.tuple(valid, fc.constantFrom(...PROTO_PREFIXES)).map(([v, p]) => ({ value: { __raw: p, v }, label: 'prototype keys' })),
    },
    {
      weight: 1,
      arbitrary: fc
        .constantFrom('{', '{"a":', '[1,2', 'nul', '\u0000', '{"a":1}{"b":2}', '"\\ud800"')
        .map((t) => ({ value: { __text: t }, label: 'broken JSON' })),
    },
  );
  return fc.tuple(body, contentTypes).map(([b, given]) => {
    const ct = b.label === 'well-formed' ? { type: 'application/json' } : given;
    let text: string;
    const raw = b.value as { __raw?: string; __text?: string; v?: unknown } | null;
    if (raw && typeof raw === 'object' && typeof raw.__text === 'string') text = raw.__text;
    else if (raw && typeof raw === 'object' && typeof raw.__raw === 'string') {
      const inner = stringifySafe(raw.v);
      text = inner.startsWith('{') && inner !== '{}' ? `{${raw.__raw},${inner.slice(1)}` : `{${raw.__raw}}`;
    } else text = spliceDeep(stringifySafe(b.value));
    return {
      text,
      contentType: ct.type,
      contentEncoding: ct.encoding,
      label: `${b.label}; ${ct.type ?? 'no content type'}${ct.encoding ? ` + ${ct.encoding}` : ''}`,
    };
  });
}
