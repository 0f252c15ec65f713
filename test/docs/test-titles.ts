/** One `it(...)` / `test(...)` call found in a test file. */
export interface TestTitle {
  /** The title as written: a plain string, or a template literal with its `${…}` parts kept. */
  raw: string;
  isTemplate: boolean;
  /** `it.skip`, `it.todo`, `test.skip` …: a test that does not run proves nothing. */
  isSkipped: boolean;
}

/** `it(` or `test(` (not `regex.test(`; optionally `.only`, `.skip`, `.todo`, `.concurrent`, `.fails`) and the quoted title after it. */
const TEST_CALL = /(?<![.\w$])(?:it|test)(?:\.(only|skip|todo|concurrent|fails))?\s*\(\s*(['"`])((?:\\[\s\S]|(?!\2)[^\\])*)\2/g;

/** Undoes the escapes a string literal may carry (`\'`, `\"`, `` \` ``, `\\`). */
function unescape(text: string): string {
  return text.replace(/\\([\s\S])/g, '$1');
}

/**
 * The titles of every `it` / `test` call in a test file's source. String search, not a parser:
 * good enough for titles, which in this repository are always the call's first argument.
 */
export function testTitles(source: string): TestTitle[] {
  const titles: TestTitle[] = [];
  for (const match of source.matchAll(TEST_CALL)) {
    const [, modifier, quote, body] = match;
    titles.push({ raw: quote === '`' ? body : unescape(body), isTemplate: quote === '`' && body.includes('${'), isSkipped: modifier === 'skip' || modifier === 'todo' });
  }
  return titles;
}

/**
 * Whether a title quoted in the checklist names this test: equal to a plain title, or fitting a
 * template title whose `${…}` parts stand for any non-empty text (e.g. `GET /api/users: clinician
 * gets 403` fits `` `${name}: ${role} gets ${status}` ``).
 */
export function titleMatches(test: TestTitle, quoted: string): boolean {
  if (!test.isTemplate) return test.raw === quoted;
  const pattern = test.raw
    .split(/\$\{[^}]*\}/)
    .map((literal) => unescape(literal).replace(/[.*+?^${}()|[\]\\]/g, '\\$&'))
    .join('.+?');
  return new RegExp(`^${pattern}$`, 's').test(quoted);
}
