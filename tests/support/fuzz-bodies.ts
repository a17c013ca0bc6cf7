import fc from 'fast-check';

/** Stands in a JSON text for a literal that JSON.stringify cannot write (-0, 1e400, a 30-digit number). */
const LITERAL = '\u0001literal:';

/** Scalars a form never sends but a hand-made request can: edge numbers, number-like strings, NUL, odd unicode. */
export const oddScalar: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(
    null,
    true,
    false,
    0,
    -1,
    1e308,
    -1e308,
    Number.MAX_SAFE_INTEGER + 2,
    Number.MIN_VALUE,
    '',
    ' ',
    'NaN',
    '-NaN',
    'Infinity',
    '-Infinity',
    '-0',
    '1e308',
    '1e999',
    '0x1F',
    'null',
    'undefined',
    'true',
    '\u0000',
    'a\u0000b',
    '\ud800',
    '\u202e\u0301',
    '💧🧪',
    "'; DROP TABLE builds; --",
    '2026-02-30',
    '2026-11-01T25:61:00Z',
    '00000000-0000-0000-0000-000000000000',
    '__proto__',
    `${LITERAL}-0`,
    `${LITERAL}1e400`,
    `${LITERAL}-1e400`,
    `${LITERAL}1e-400`,
    `${LITERAL}123456789012345678901234567890`,
  ),
  fc.integer(),
  fc.double(),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.integer({ min: 1, max: 110_000 }).map((length) => 'x'.repeat(length)),
);

/** Text a spreadsheet would run as a formula if an export wrote it as it is (OWASP "CSV Injection"). */
export const formulaText: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(
    '=HYPERLINK("https://example.org/x","open")',
    "+cmd|' /C calc'!A0",
    '@SUM(1+1)*cmd|" /C calc"!A0',
    '-2+3+cmd|" /C calc"!A0',
    '=1+1',
    '\t=1+1',
    '\r=1+1',
  ),
  fc
    .tuple(fc.constantFrom('=', '+', '-', '@'), fc.string({ unit: 'grapheme', maxLength: 30 }))
    .map(([lead, rest]) => `${lead}${rest.trim()}x`),
);

/**
 * Values a real bench never has but a schema might let through: an outline whose edges cross, sizes past
 * any base, a million layers, a hair's-breadth maximum layer, and formula text.
 */
export const tradeEdge: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(
    {
      kind: 'polygon',
      points: [
        { xMm: 0, yMm: 0 },
        { xMm: 100, yMm: 100 },
        { xMm: 100, yMm: 0 },
        { xMm: 0, yMm: 100 },
      ],
    },
    { kind: 'rectangle', lengthMm: 1e7, widthMm: 1e7 },
    { kind: 'circle', diameterMm: 1e300 },
    { kind: 'area', areaMm2: 1e15 },
    10_001,
    1e7,
    1e12,
    1_000_000,
    51,
    1e-6,
  ),
  fc.integer({ min: 51, max: 10_000_000 }),
  formulaText,
);

/** Arrays or objects nested far deeper than any record, up to the body size limit's worth of brackets. */
export const deepNesting: fc.Arbitrary<unknown> = fc
  .tuple(fc.integer({ min: 50, max: 50_000 }), fc.boolean())
  .map(([depth, arrays]) => {
    const [open, close] = arrays ? ['[', ']'] : ['{"a":', '}'];
    // Written as text: JSON.stringify itself runs out of stack on values this deep.
    return `${LITERAL}${open.repeat(depth)}1${close.repeat(depth)}`;
  });

/** Anything JSON can say, some of it wildly so. */
export const anyJson: fc.Arbitrary<unknown> = fc.oneof(
  { arbitrary: fc.jsonValue(), weight: 3 },
  { arbitrary: fc.object({ values: [oddScalar] }), weight: 3 },
  { arbitrary: fc.dictionary(fc.string(), oddScalar), weight: 1 },
  { arbitrary: deepNesting, weight: 1 },
  { arbitrary: oddScalar, weight: 1 },
);

/** An object with the schema's own field names, each holding something odd or of the wrong kind. */
export function wrongTypesFor(fields: readonly string[]): fc.Arbitrary<unknown> {
  if (fields.length === 0) return fc.object({ values: [oddScalar] });
  return fc.record(Object.fromEntries(fields.map((field) => [field, fc.oneof(oddScalar, fc.jsonValue())])), {
    requiredKeys: [],
  });
}

/** A valid body with one field, at any depth, changed to something odd, removed, or joined by an extra field. */
export function nearValid(valid: Record<string, unknown>): fc.Arbitrary<unknown> {
  const paths = fieldPaths(valid);
  return fc.oneof(
    fc
      .tuple(
        fc.constantFrom(...paths),
        fc.oneof({ arbitrary: oddScalar, weight: 4 }, { arbitrary: tradeEdge, weight: 2 }, fc.jsonValue()),
      )
      .map(([path, value]) => withField(valid, path, value)),
    fc.constantFrom(...paths).map((path) => withField(valid, path, undefined)),
    fc
      .tuple(fc.string({ minLength: 1, maxLength: 12 }), oddScalar)
      .map(([extra, value]) => ({ ...structuredClone(valid), [extra]: value })),
  );
}

/** The JSON text to send: LITERAL markers become the bare number they stand for. */
export function jsonText(body: unknown): string {
  const text = JSON.stringify(body) ?? 'null';
  if (!text.includes('\\u0001literal:')) return text;
  return text.replace(/"\\u0001literal:((?:[^"\\]|\\.)*)"/g, (_, raw: string) => JSON.parse(`"${raw}"`) as string);
}

/** Bodies that are not JSON at all, sent as JSON. */
export const brokenJsonText: fc.Arbitrary<string> = fc.oneof(
  fc.string(),
  fc.constantFrom('{', '{"a":', '[1,]', '{"a":NaN}', '{"a":Infinity}', "{'a':1}", '\u0000', '{"a":1}{'),
);

function fieldPaths(value: Record<string, unknown>, prefix: readonly string[] = []): string[][] {
  return Object.entries(value).flatMap(([key, inner]) => {
    const path = [...prefix, key];
    const deeper =
      inner && typeof inner === 'object' && !Array.isArray(inner)
        ? fieldPaths(inner as Record<string, unknown>, path)
        : [];
    return [path, ...deeper];
  });
}

function withField(valid: Record<string, unknown>, path: readonly string[], value: unknown): Record<string, unknown> {
  const copy = structuredClone(valid);
  let at: Record<string, unknown> = copy;
  for (const key of path.slice(0, -1)) at = at[key] as Record<string, unknown>;
  const last = path.at(-1)!;
  if (value === undefined) delete at[last];
  else at[last] = value;
  return copy;
}
