import fc from 'fast-check';
import * as z from 'zod';
import type { JSONSchema } from 'zod/v4/core';
import { EDGE_NUMBER_TOKENS, NON_FINITE_TOKENS, NUMERIC_LOOKING_STRINGS, anyJsonValue, longString, nastyString, noiseKey, pollutionPayload } from '../generators';
import { RawJson, cloneValue, setOwn, type FuzzValue } from './json-text';

/*
 * Invalid bodies by construction. A route's zod schema is turned into JSON Schema (zod's own
 * `toJSONSchema`, input side), and every node yields values that break a constraint it states:
 * a wrong JSON type, a string past `maxLength` or outside `pattern`/`enum`/`format`, a number
 * past its bounds or not an integer, a required key removed. Refinements that JSON Schema cannot
 * express are never relied on, so every generated break is a break zod reports.
 */

type Node = JSONSchema.JSONSchema;
type Path = (string | number)[];

/** JSON Schema of a zod schema as the client sends it (defaults make keys optional). */
export function jsonSchemaOf(schema: z.ZodType): Node {
  return z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' });
}

function asNode(schema: JSONSchema._JSONSchema | JSONSchema._JSONSchema[] | undefined): Node | undefined {
  return schema === undefined || typeof schema === 'boolean' || Array.isArray(schema) ? undefined : schema;
}

/** The branches of `anyOf` / `oneOf` (zod writes nullable as anyOf, discriminated unions as oneOf). */
function branchesOf(node: Node): Node[] | undefined {
  return node.anyOf ?? node.oneOf;
}

function typesOf(node: Node): Set<string> {
  const branches = branchesOf(node);
  if (branches) return new Set(branches.flatMap((branch) => [...typesOf(branch)]));
  if (node.enum) return new Set(node.enum.map((value) => (value === null ? 'null' : typeof value)));
  const declared = node.type === undefined ? [] : Array.isArray(node.type) ? node.type : [node.type];
  return new Set(declared.map((type) => (type === 'integer' ? 'number' : type)));
}

function isNullable(node: Node): boolean {
  return typesOf(node).has('null');
}

/** Values of JSON types the node does not admit. */
function wrongType(node: Node): fc.Arbitrary<FuzzValue> | undefined {
  const admitted = typesOf(node);
  if (admitted.size === 0) return undefined;
  const options: fc.Arbitrary<FuzzValue>[] = [];
  if (!admitted.has('string')) options.push(fc.constantFrom(...NUMERIC_LOOKING_STRINGS), nastyString, fc.constantFrom('true', 'false', '[]', '{}'));
  if (!admitted.has('number')) options.push(fc.constantFrom(...EDGE_NUMBER_TOKENS).map((token) => new RawJson(token)), fc.integer(), fc.double({ noNaN: true, noDefaultInfinity: true }));
  if (!admitted.has('boolean')) options.push(fc.boolean());
  if (!admitted.has('null')) options.push(fc.constant(null));
  if (!admitted.has('array')) options.push(fc.array(anyJsonValue, { maxLength: 3 }));
  if (!admitted.has('object')) options.push(fc.dictionary(noiseKey, anyJsonValue, { maxKeys: 3 }), pollutionPayload);
  return options.length ? fc.oneof(...options) : undefined;
}

/** A string that no transform zod applies here (trim, case) brings inside the pattern or the enum. */
function outsideText(accepts: (text: string) => boolean, candidates: string[] = []): fc.Arbitrary<FuzzValue> {
  const isOutside = (text: string) => !variantsOf(text).some(accepts);
  const mangled = candidates.filter(isOutside);
  const free = fc.oneof(nastyString, fc.string({ maxLength: 12 })).filter(isOutside);
  return mangled.length ? fc.oneof(free, fc.constantFrom(...mangled)) : free;
}

function variantsOf(text: string): string[] {
  const trimmed = text.trim();
  return [text, trimmed, text.toUpperCase(), text.toLowerCase(), trimmed.toUpperCase(), trimmed.toLowerCase()];
}

function stringBreaks(node: Node): fc.Arbitrary<FuzzValue>[] {
  const breaks: fc.Arbitrary<FuzzValue>[] = [];
  if (node.maxLength !== undefined) breaks.push(longString(node.maxLength + 1));
  if (node.minLength !== undefined && node.minLength > 0) breaks.push(fc.string({ maxLength: node.minLength - 1 }));
  if (node.pattern !== undefined) {
    const pattern = new RegExp(node.pattern);
    breaks.push(outsideText((text) => pattern.test(text)));
  }
  if (node.format === 'email') breaks.push(outsideText((text) => text.includes('@')));
  if (node.enum) {
    const allowed = new Set<unknown>(node.enum);
    // Near misses: a zero-width space, a Cyrillic look-alike vowel, an SQL comment.
    const nearMisses = node.enum.filter((value): value is string => typeof value === 'string').flatMap((value) => [`${value}\u200b`, value.replace(/[aeio]/, 'а'), `${value}'--`]);
    breaks.push(outsideText((text) => allowed.has(text), nearMisses));
  }
  return breaks;
}

function numberBreaks(node: Node, isInteger: boolean): fc.Arbitrary<FuzzValue>[] {
  const breaks: fc.Arbitrary<FuzzValue>[] = [fc.constantFrom(...NON_FINITE_TOKENS).map((token) => new RawJson(token))];
  const lowest = typeof node.exclusiveMinimum === 'number' ? node.exclusiveMinimum : node.minimum;
  if (node.maximum !== undefined) {
    const maximum = node.maximum;
    breaks.push(fc.constantFrom(maximum + 1, maximum + 0.5, 1e308), fc.constant(new RawJson('123456789012345678901234567890')));
  }
  if (typeof node.exclusiveMinimum === 'number') breaks.push(fc.constantFrom(node.exclusiveMinimum, node.exclusiveMinimum - 1, -1e308));
  if (node.exclusiveMinimum === 0) breaks.push(fc.constant(new RawJson('-0')));
  if (node.minimum !== undefined) breaks.push(fc.constantFrom(node.minimum - 1, node.minimum - 0.5, -1e308));
  if (isInteger) breaks.push(fc.constant((lowest ?? 0) + 1.5), fc.constant(new RawJson('9007199254740993')));
  return breaks;
}

/** Values that break `node` on their own, wherever they are placed. */
export function invalidValue(node: Node): fc.Arbitrary<FuzzValue> | undefined {
  const union = branchesOf(node);
  if (union) {
    // `T | null`: break T with anything but null; other unions only by a type no branch admits.
    const branches = union.filter((branch) => branch.type !== 'null');
    if (branches.length === 1) return invalidValue(branches[0])?.filter((value) => value !== null);
    return wrongType(node);
  }
  const options: fc.Arbitrary<FuzzValue>[] = [];
  const wrong = wrongType(node);
  if (wrong) options.push(wrong);
  if (node.type === 'string') options.push(...stringBreaks(node));
  if (node.type === 'number' || node.type === 'integer') options.push(...numberBreaks(node, node.type === 'integer'));
  if (node.type === 'array') {
    if (node.maxItems !== undefined) options.push(fc.constant(Array.from({ length: node.maxItems + 1 }, () => 0)));
    if (node.minItems !== undefined && node.minItems > 0) options.push(fc.constant([]));
    const items = asNode(node.items);
    const item = items && invalidValue(items);
    if (item) options.push(item.map((value) => [value]));
  }
  if (node.type === 'object') {
    if (node.required?.length) options.push(fc.constant({}));
    const broken = Object.entries(node.properties ?? {}).flatMap(([key, property]) => {
      const child = asNode(property);
      const value = child ? invalidValue(child) : undefined;
      return value ? [value.map((item) => withKey({}, key, item))] : [];
    });
    if (broken.length) options.push(fc.oneof(...broken));
  }
  return options.length ? fc.oneof(...options) : undefined;
}

function withKey(target: Record<string, FuzzValue>, key: string, value: FuzzValue): Record<string, FuzzValue> {
  setOwn(target, key, value);
  return target;
}

/** One way to break a body: replace the value at `path`, or delete the required key at `path`. */
export interface BreakSite {
  path: Path;
  replacement?: fc.Arbitrary<FuzzValue>;
}

function isRecord(value: unknown): value is Record<string, FuzzValue> {
  return typeof value === 'object' && value !== null && !Array.isArray(value) && !(value instanceof RawJson);
}

/**
 * The node to descend into: T of `T | null`, or the branch of a discriminated union whose
 * `const` property the base carries (that property is the discriminator).
 */
function branchFor(node: Node, base: unknown): { target: Node; discriminator?: string } {
  const branches = branchesOf(node)?.filter((branch) => branch.type !== 'null');
  if (!branches) return { target: node };
  if (branches.length === 1) return { target: branches[0] };
  for (const branch of branches) {
    for (const [key, property] of Object.entries(branch.properties ?? {})) {
      const child = asNode(property);
      if (child?.const !== undefined && isRecord(base) && base[key] === child.const) return { target: branch, discriminator: key };
    }
  }
  return { target: node };
}

/** Every place where `base` (valid for `node`) can be broken, each a break on its own. */
export function breakSites(node: Node, base: unknown, path: Path = []): BreakSite[] {
  const sites: BreakSite[] = [];
  const whole = invalidValue(node);
  if (whole) sites.push({ path, replacement: whole });
  const { target, discriminator } = branchFor(node, base);
  if (target.type === 'object' && isRecord(base)) {
    for (const key of target.required ?? []) if (base[key] !== undefined) sites.push({ path: [...path, key] });
    for (const [key, property] of Object.entries(target.properties ?? {})) {
      const child = asNode(property);
      // Another value of the discriminator may pick another, valid branch: it is only ever removed.
      if (!child || key === discriminator) continue;
      if (base[key] === undefined) {
        const replacement = invalidValue(child);
        if (replacement) sites.push({ path: [...path, key], replacement });
      } else sites.push(...breakSites(child, base[key], [...path, key]));
    }
  }
  const items = asNode(target.items);
  if (target.type === 'array' && Array.isArray(base) && items) base.forEach((item, index) => sites.push(...breakSites(items, item, [...path, index])));
  return sites;
}

/** Applies one break to a copy of `body`: the replacement (the root itself may be replaced), or the removal of a required key. */
export function applyBreak(body: FuzzValue, site: BreakSite, replacement: FuzzValue | undefined): FuzzValue {
  const isRemoval = site.replacement === undefined;
  if (site.path.length === 0) return isRemoval || replacement === undefined ? body : replacement;
  const copy = cloneValue(body);
  let parent: unknown = copy;
  for (const step of site.path.slice(0, -1)) {
    if (Array.isArray(parent) && typeof step === 'number') parent = parent[step];
    else if (isRecord(parent) && typeof step === 'string') parent = parent[step];
    else parent = undefined;
  }
  const last = site.path[site.path.length - 1];
  if (Array.isArray(parent) && typeof last === 'number') {
    // An earlier break may have replaced the array: never write past its end (that leaves holes).
    if (replacement !== undefined && last < parent.length) parent[last] = replacement;
  } else if (isRecord(parent) && typeof last === 'string') {
    if (isRemoval) delete parent[last];
    else if (replacement !== undefined) setOwn(parent, last, replacement);
  }
  return copy;
}

/** A body broken at one to three sites: invalid for the schema whatever else it carries. */
export function brokenBody(node: Node, base: FuzzValue): fc.Arbitrary<FuzzValue> {
  const sites = breakSites(node, base);
  if (sites.length === 0) throw new Error('This schema states no constraint to break.');
  const oneBreak = fc.nat({ max: sites.length - 1 }).chain((index) => {
    const site = sites[index];
    return (site.replacement ?? fc.constant(undefined)).map((replacement) => ({ site, replacement }));
  });
  return fc.array(oneBreak, { minLength: 1, maxLength: 3 }).map((breaks) => breaks.reduce<FuzzValue>((body, { site, replacement }) => applyBreak(body, site, replacement), base));
}

/** Unknown keys (prototype keys, hostile names) added at the top of an object body; zod strips them. */
export function withNoise(node: Node, body: FuzzValue): fc.Arbitrary<FuzzValue> {
  if (!isRecord(body)) return fc.constant(body);
  const known = new Set(Object.keys(node.properties ?? {}));
  const extra = fc.array(fc.tuple(noiseKey.filter((key) => !known.has(key)), fc.oneof(anyJsonValue, pollutionPayload)), { maxLength: 4 });
  return extra.map((entries) => {
    const copy = cloneValue(body);
    for (const [key, value] of entries) setOwn(copy, key, value);
    return copy;
  });
}
