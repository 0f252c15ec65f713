/**
 * A literal JSON token written into the body text as it is. `JSON.stringify` cannot write
 * `1e309` (parses to Infinity), `-0` or integers beyond 2^53, so the fuzz bodies carry them
 * as raw tokens.
 */
export class RawJson {
  constructor(readonly token: string) {}
}

/** What a generated body may hold: plain JSON values, raw tokens, and objects with any own keys. */
export type FuzzValue = null | boolean | number | string | RawJson | FuzzValue[] | { [key: string]: FuzzValue };

/**
 * Sets an own, enumerable property, also for `__proto__`: a plain assignment would call the
 * prototype setter instead, and the key would never reach the wire.
 */
export function setOwn(target: Record<string, unknown>, key: string, value: unknown): void {
  Object.defineProperty(target, key, { value, enumerable: true, writable: true, configurable: true });
}

/** A deep copy that keeps own `__proto__` keys and raw tokens (structuredClone drops class instances). */
export function cloneValue<T>(value: T): T {
  if (value instanceof RawJson || value === null || typeof value !== 'object') return value;
  if (Array.isArray(value)) return value.map((item) => cloneValue(item)) as T;
  const copy: Record<string, unknown> = {};
  for (const [key, item] of Object.entries(value)) setOwn(copy, key, cloneValue(item));
  return copy as T;
}

/** The JSON text of a fuzz value. Strings go through `JSON.stringify`, so lone surrogates become `\udXXX` escapes. */
export function toJsonText(value: unknown): string {
  if (value instanceof RawJson) return value.token;
  if (value === null || value === undefined) return 'null';
  if (typeof value === 'number') return Number.isFinite(value) ? JSON.stringify(value) : 'null';
  if (typeof value === 'string' || typeof value === 'boolean') return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map((item) => toJsonText(item)).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>).filter(([, item]) => item !== undefined);
  return `{${entries.map(([key, item]) => `${JSON.stringify(key)}:${toJsonText(item)}`).join(',')}}`;
}

/** What the server's JSON parser makes of a fuzz value (raw tokens included). */
export function asParsed(value: unknown): unknown {
  return JSON.parse(toJsonText(value));
}
