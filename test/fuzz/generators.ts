import fc from 'fast-check';
import { RawJson, setOwn, type FuzzValue } from './support/json-text';

/*
 * The hostile values the write-route fuzz suite draws from. Families follow the OWASP Web
 * Security Testing Guide (input validation: SQL injection, path traversal, HTTP parameter
 * pollution) and the "big list of naughty strings" idea (unicode edge cases); which ones a field
 * rejects is decided in support/schema-breaker.ts.
 */

/** SQL-looking text (OWASP WSTG-INPV-05 examples). */
export const SQL_STRINGS = [
  "' OR 1=1 --",
  '"; DROP TABLE x; --',
  "1; DROP TABLE surgical_case; --",
  "' UNION SELECT name, sql FROM sqlite_master --",
  "admin'--",
  "%' AND 1=0 UNION SELECT sqlite_version() --",
  "1' AND SLEEP(5)#",
] as const;

/** Path-traversal text and file names (OWASP WSTG-ATHZ-01 examples). */
export const TRAVERSAL_STRINGS = [
  '../../etc/passwd',
  '..\\..\\win.ini',
  '%2e%2e%2f',
  '..%2f..%2fetc%2fpasswd',
  '%252e%252e%252f',
  '....//....//etc/passwd',
  '/etc/passwd',
  'C:\\Windows\\win.ini',
  '\\\\server\\share\\x',
  'file:///etc/passwd',
  '..%c0%af..%c0%afetc',
] as const;

/** Markup, template and spreadsheet-formula text. */
export const MARKUP_STRINGS = ['<script>alert(1)</script>', '{{constructor.constructor("return 1")()}}', '${7*7}', '=cmd|" /C calc"!A0', '@SUM(1+1)', '<svg onload=alert(1)>'] as const;

/** Unicode pieces: emoji and ZWJ sequences, RTL override and scripts, combining marks, zero-width, lone surrogates, NUL. */
export const UNICODE_PIECES = [
  '😀',
  '👩‍👩‍👧‍👦',
  '\u202eevil',
  'שלום',
  'مرحبا',
  'e\u0301\u0301\u0301',
  'Z\u0351\u036b\u0343\u036a\u0302\u036b\u033d\u034f\u0334\u0319',
  '\u200b',
  '\ufeff',
  '\ud800',
  '\udfff',
  '\u0000',
  '\u2028',
  '\r\n',
  '𝕏',
  '\uffff',
  'İı',
] as const;

/** Keys that reach for the prototype chain when code copies objects naively. */
export const PROTOTYPE_KEYS = ['__proto__', 'constructor', 'prototype'] as const;

/** Property name a pollution payload would add to every object; the suite checks it never appears. */
export const POLLUTION_CANARY = 'tmFuzzPolluted';

/** Text a number field must refuse: NaN-like, hexadecimal, locale digits, padded, empty. */
export const NUMERIC_LOOKING_STRINGS = ['NaN', 'Infinity', '-Infinity', '1e308', '-0', '0x1F', '1_000', '١٢٣', ' 42 ', '', 'null', 'undefined', '1,5', '0.5mm'] as const;

/** Number tokens at the edges of what JSON and IEEE 754 hold. */
export const EDGE_NUMBER_TOKENS = ['1e309', '-1e309', '1e308', '-1e308', '-0', '123456789012345678901234567890', '9007199254740993', '4.9e-324'] as const;

/** Tokens every `z.number()` refuses, whatever its range: they parse to ±Infinity. */
export const NON_FINITE_TOKENS = ['1e309', '-1e309'] as const;

/** A short unicode-heavy string (pieces, random binary code points and lone surrogates). */
export const unicodeString: fc.Arbitrary<string> = fc.oneof(
  fc.array(fc.constantFrom(...UNICODE_PIECES), { minLength: 1, maxLength: 8 }).map((pieces) => pieces.join('')),
  fc.string({ unit: 'binary', minLength: 1, maxLength: 40 }),
  fc.array(fc.integer({ min: 0xd800, max: 0xdfff }), { minLength: 1, maxLength: 4 }).map((codes) => String.fromCharCode(...codes)),
);

/** Any of the hostile families, kept short. */
export const nastyString: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(...SQL_STRINGS, ...TRAVERSAL_STRINGS, ...MARKUP_STRINGS, ...PROTOTYPE_KEYS),
  unicodeString,
  fc.string({ maxLength: 30 }),
);

/** Non-whitespace units, so `.trim()` cannot shorten a long string below its limit. */
const LONG_UNITS = ['x', '😀', 'é', 'ש', 'A\u0301', "'", '%2e'] as const;

/**
 * A string of at least `minLength` code points (zod counts code points, not UTF-16 units) and at
 * most ~`maxBytes` of UTF-8, made of one repeated non-whitespace unit.
 */
export function longString(minLength: number, maxBytes = 200_000): fc.Arbitrary<string> {
  return fc.constantFrom(...LONG_UNITS).chain((unit) => {
    const fewest = Math.ceil(minLength / [...unit].length);
    const most = Math.max(fewest, Math.floor(maxBytes / Buffer.byteLength(unit)));
    return fc.integer({ min: fewest, max: most }).map((count) => unit.repeat(count));
  });
}

/** Raw number tokens and NaN-like text. */
export const edgeNumber: fc.Arbitrary<FuzzValue> = fc.oneof(
  fc.constantFrom(...EDGE_NUMBER_TOKENS).map((token) => new RawJson(token)),
  fc.constantFrom(...NUMERIC_LOOKING_STRINGS),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer(),
);

/** A `{ "__proto__": { canary } }`-style payload under one of the prototype keys. */
export const pollutionPayload: fc.Arbitrary<FuzzValue> = fc.constantFrom(...PROTOTYPE_KEYS).map((key) => {
  const inner: Record<string, FuzzValue> = {};
  setOwn(inner, POLLUTION_CANARY, 'yes');
  setOwn(inner, 'isAdmin', true);
  const outer: Record<string, FuzzValue> = {};
  setOwn(outer, key, key === 'constructor' ? { prototype: inner } : inner);
  return outer;
});

/** Arrays or objects nested `depth` levels deep, as a raw token (JSON.stringify would recurse). */
export const deepNesting: fc.Arbitrary<FuzzValue> = fc
  .tuple(fc.integer({ min: 1, max: 20_000 }), fc.boolean())
  .map(([depth, isArray]) => new RawJson(isArray ? '['.repeat(depth) + ']'.repeat(depth) : '{"a":'.repeat(depth) + '1' + '}'.repeat(depth)));

/** Any JSON-ish value: plain JSON, nested, hostile text, edge numbers, pollution payloads. */
export const anyJsonValue: fc.Arbitrary<FuzzValue> = fc.oneof(
  { arbitrary: fc.jsonValue({ maxDepth: 3 }) as fc.Arbitrary<FuzzValue>, weight: 3 },
  { arbitrary: nastyString, weight: 2 },
  { arbitrary: edgeNumber, weight: 1 },
  { arbitrary: pollutionPayload, weight: 1 },
  { arbitrary: deepNesting, weight: 1 },
);

/** Keys added to objects as noise: prototype keys, hostile text, plausible-but-unknown names. */
export const noiseKey: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(...PROTOTYPE_KEYS, 'id', 'isAdmin', 'createdAt', 'passwordHash', 'deletedAt', '$where', 'toString', 'hasOwnProperty', ''),
  nastyString,
);

/**
 * Percent-encodes every byte of the UTF-8 form except RFC 3986 unreserved characters. Unlike
 * `encodeURIComponent` it accepts lone surrogates (they become U+FFFD's bytes).
 */
export function percentEncoded(text: string): string {
  return [...Buffer.from(text, 'utf8')].map((byte) => (/[A-Za-z0-9\-._~]/.test(String.fromCharCode(byte)) ? String.fromCharCode(byte) : `%${byte.toString(16).toUpperCase().padStart(2, '0')}`)).join('');
}

/** Route-parameter spellings that are never a canonical id, including spellings of an existing id. */
export function malformedIdSegment(existingId: number): fc.Arbitrary<string> {
  const spellingsOfExisting = [`0x${existingId.toString(16)}`, `%20${existingId}`, `${existingId}.0`, `0${existingId}`, `${existingId}e0`, `+${existingId}`, `${existingId}%20`, `${existingId}%00`];
  const fixed = ['abc', '-1', '0', '-0', '1.5', '1e3', '99999999999999999999', '2147483649', '1;DROP', '1%3BDROP%20TABLE%20x', '%2e%2e%2f', '..', '..%2F..%2Fetc%2Fpasswd', '%00', 'NaN', 'Infinity', '%5B%5D', '__proto__', 'constructor', '%F0%9F%98%80', '%E0%A4%A', '%'];
  return fc.oneof(
    fc.constantFrom(...spellingsOfExisting, ...fixed),
    fc.oneof(nastyString, fc.string({ minLength: 1, maxLength: 30 })).filter((text) => text.length > 0 && !/^[1-9]\d*$/.test(text)).map(percentEncoded),
  );
}

/** Canonical ids that no fixture row has (every fixture id is far below a million). */
export const missingIdSegment: fc.Arbitrary<string> = fc.integer({ min: 1_000_000, max: 2 ** 31 }).map(String);

/** Content types a JSON route must not read as JSON (no header at all is `''`). */
export const NON_JSON_CONTENT_TYPES = [
  'text/plain',
  'text/plain; charset=utf-8',
  'application/x-www-form-urlencoded',
  'multipart/form-data; boundary=fuzz',
  'application/xml',
  'application/json-patch+json',
  'application/vnd.api+json',
  'application/octet-stream',
  'application/jsonx',
  '',
] as const;

/** JSON content types the server must refuse by charset or encoding (a 415 or a 400, never a read). */
export const BAD_ENCODING_HEADERS: readonly Record<string, string>[] = [
  { 'content-type': 'application/json; charset=latin1' },
  { 'content-type': 'application/json; charset=us-ascii' },
  { 'content-type': 'application/json; charset=utf-16' },
  { 'content-type': 'application/json', 'content-encoding': 'gzip' },
  { 'content-type': 'application/json', 'content-encoding': 'deflate' },
  { 'content-type': 'application/json', 'content-encoding': 'br' },
  { 'content-type': 'application/json', 'content-encoding': 'x-fuzz' },
];

/**
 * Turns a valid JSON text into one that no JSON parser accepts: a strict prefix of an object
 * text never closes, and the other edits break the grammar (RFC 8259).
 */
export function malformedJsonText(validText: string): fc.Arbitrary<string> {
  return fc.oneof(
    fc.integer({ min: 1, max: Math.max(1, validText.length - 1) }).map((cut) => validText.slice(0, cut)),
    fc.constant(validText.replace('"', "'")),
    fc.constant(validText.replace(/}$/, ',}')),
    fc.constant(validText.replace(/^\{/, '{"n": NaN,')),
    fc.constant(`/* note */${validText}`),
    fc.constant(validText.replace(/^\{/, '{"c":"\u0001",')),
    fc.constant(validText.replace(/^\{"([^"]+)"/, '{$1')),
    fc.constant(`${validText}${validText}`),
    fc.constant('undefined'),
  ).filter((text) => !isJson(text));
}

function isJson(text: string): boolean {
  try {
    JSON.parse(text);
    return true;
  } catch {
    // Not JSON: exactly what the generator wants.
    return false;
  }
}
