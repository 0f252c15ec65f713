import type { AsvsChapter } from './asvs-requirements';
import { testTitles, titleMatches, type TestTitle } from './test-titles';

/** The header every chapter table of docs/asvs-5.0-l2.md carries, cell by cell. */
export const CHECKLIST_HEADER = ['id', 'level', 'requirement (short)', 'status', 'proof (file › test title) or reason'] as const;

/** Statuses a row may have; anything but `met` must say why in the last column. */
export const CHECKLIST_STATUSES = ['met', 'partly', 'not met', 'n/a', 'deployment'] as const;

/** What kind of rule a problem breaks, so the spec can report each kind on its own. */
export type ChecklistProblemKind = 'format' | 'coverage' | 'status' | 'reference';

export interface ChecklistProblem {
  kind: ChecklistProblemKind;
  /** Where and what, e.g. `line 88, v5.0.0-6.3.3: no it(...) titled "…" in test/api/x.spec.ts`. */
  message: string;
}

/** A proof: a test file and one of its `it` titles, or a Markdown file and one of its headings. */
export interface ChecklistReference {
  path: string;
  text: string;
}

/** One table row of the checklist. */
export interface ChecklistRow {
  line: number;
  chapter: number;
  id: string;
  level: string;
  requirement: string;
  status: string;
  references: ChecklistReference[];
  /** The last column without its references: the reason, in words. */
  reason: string;
}

/** How the checker reaches files; paths are relative to the repository root. */
export interface ChecklistFiles {
  exists(path: string): boolean;
  read(path: string): string;
}

const CHAPTER_HEADING = /^## V(\d+) (.+)$/;
const REFERENCE = /`([^`]+)`\s*›\s*`([^`]+)`/g;
const TEST_FILE = /\.(spec|e2e)\.ts$/;

/** Splits a Markdown table line into trimmed cells; a `|` inside backticks or escaped as `\|` stays in its cell. */
function cells(line: string): string[] {
  const result: string[] = [];
  let current = '';
  let isInCode = false;
  for (let index = 0; index < line.length; index++) {
    const char = line[index];
    if (char === '\\' && line[index + 1] === '|') {
      current += '|';
      index++;
    } else if (char === '`') {
      isInCode = !isInCode;
      current += char;
    } else if (char === '|' && !isInCode) {
      result.push(current.trim());
      current = '';
    } else {
      current += char;
    }
  }
  result.push(current.trim());
  // A table line starts and ends with a pipe: drop the empty edges.
  return result.slice(1, -1);
}

/** The reason left in a proof cell once its references are taken out, or '' when fewer than two words remain. */
function reasonOf(proof: string): string {
  const text = proof.replace(REFERENCE, ' ').replace(/\s+/g, ' ').trim();
  return (text.match(/[A-Za-z]{2,}/g) ?? []).length >= 2 ? text : '';
}

interface ParsedChecklist {
  chapters: Map<number, { name: string; line: number }>;
  rows: ChecklistRow[];
  problems: ChecklistProblem[];
}

/** Reads the chapter sections (`## V<n> <name>`) and their one table each. */
export function parseChecklist(markdown: string): ParsedChecklist {
  const chapters = new Map<number, { name: string; line: number }>();
  const rows: ChecklistRow[] = [];
  const problems: ChecklistProblem[] = [];
  const format = (line: number, message: string) => problems.push({ kind: 'format', message: `line ${line}: ${message}` });
  let chapter: number | null = null;
  let tableCount = 0;
  let tableLine = 0;
  const lines = markdown.split(/\r?\n/);

  lines.forEach((text, index) => {
    const line = index + 1;
    if (text.startsWith('## ')) {
      const heading = CHAPTER_HEADING.exec(text);
      chapter = heading ? Number(heading[1]) : null;
      tableCount = 0;
      if (heading && chapter !== null) {
        if (chapters.has(chapter)) format(line, `chapter V${chapter} appears twice`);
        chapters.set(chapter, { name: heading[2].trim(), line });
      }
      return;
    }
    if (chapter === null) return;
    if (!text.startsWith('|')) {
      tableLine = 0;
      return;
    }
    tableLine++;
    if (tableLine === 1) {
      tableCount++;
      if (tableCount > 1) format(line, `chapter V${chapter} has more than one table`);
      const header = cells(text);
      if (header.join(' | ') !== CHECKLIST_HEADER.join(' | ')) format(line, `table header is "${header.join(' | ')}", expected "${CHECKLIST_HEADER.join(' | ')}"`);
      return;
    }
    if (tableLine === 2) {
      if (!/^\|(\s*:?-{3,}:?\s*\|)+$/.test(text.trim())) format(line, 'the line after the header is not a table separator');
      return;
    }
    const row = cells(text);
    if (row.length !== CHECKLIST_HEADER.length) {
      format(line, `row has ${row.length} cells, expected ${CHECKLIST_HEADER.length}`);
      return;
    }
    const [id, level, requirement, status, proof] = row;
    const references = [...proof.matchAll(REFERENCE)].map(([, path, referenced]) => ({ path, text: referenced }));
    const loose = /`([^`]+\.(?:spec|e2e)\.ts)`/.exec(proof.replace(REFERENCE, ' '));
    if (loose) format(line, `${id} names ${loose[1]} without an it(...) title (\`file\` › \`title\`)`);
    rows.push({ line, chapter, id, level, requirement, status, references, reason: reasonOf(proof) });
  });
  return { chapters, rows, problems };
}

/**
 * Checks docs/asvs-5.0-l2.md: the chapter tables and their format, that every Level 1 and 2
 * requirement of `chapters` is listed once at its level, that every row has an allowed status and
 * a proof or a reason (`met` needs a proof), and that every proof points at an existing test file
 * and one of its (not skipped) `it` titles, or at an existing Markdown file and one of its headings.
 */
export function checkAsvsChecklist(markdown: string, chapters: readonly AsvsChapter[], files: ChecklistFiles): ChecklistProblem[] {
  const parsed = parseChecklist(markdown);
  const problems = [...parsed.problems];
  const report = (kind: ChecklistProblemKind, row: ChecklistRow | null, message: string) =>
    problems.push({ kind, message: row ? `line ${row.line}, ${row.id}: ${message}` : message });

  for (const expected of chapters) {
    const found = parsed.chapters.get(expected.number);
    if (!found) report('format', null, `chapter heading "## V${expected.number} ${expected.name}" is missing`);
    else if (found.name !== expected.name) report('format', null, `line ${found.line}: chapter V${expected.number} is named "${found.name}", expected "${expected.name}"`);
  }

  const seen = new Set<string>();
  for (const row of parsed.rows) {
    const id = /^v5\.0\.0-(\d+)\.(\d+)\.(\d+)$/.exec(row.id);
    const chapter = chapters.find((candidate) => candidate.number === row.chapter);
    if (!id) {
      report('format', row, 'the id must look like v5.0.0-6.3.3');
      continue;
    }
    const bare = row.id.slice('v5.0.0-'.length);
    if (Number(id[1]) !== row.chapter) report('coverage', row, `is listed under V${row.chapter}`);
    if (seen.has(bare)) report('coverage', row, 'is listed twice');
    seen.add(bare);
    const expectedLevel = chapter?.requirements[bare];
    if (expectedLevel === undefined) report('coverage', row, 'is not a Level 1 or 2 requirement of ASVS 5.0.0 in this chapter');
    else if (row.level !== String(expectedLevel)) report('coverage', row, `level is ${row.level}, ASVS 5.0.0 says ${expectedLevel}`);
    if (row.requirement.length < 10) report('format', row, 'the requirement needs a short description');

    if (!(CHECKLIST_STATUSES as readonly string[]).includes(row.status)) report('status', row, `status "${row.status}" is not one of ${CHECKLIST_STATUSES.join(', ')}`);
    else if (row.references.length === 0 && !row.reason) report('status', row, 'has neither a proof (`file` › `title`) nor a reason');
    else if (row.status === 'met' && row.references.length === 0) report('status', row, 'is met, so it needs a proof (`file` › `title`)');
    else if (row.status !== 'met' && !row.reason) report('status', row, `is "${row.status}", so it needs a reason in words`);
  }
  for (const chapter of chapters) {
    for (const id of Object.keys(chapter.requirements)) {
      if (!seen.has(id)) report('coverage', null, `v5.0.0-${id} (level ${chapter.requirements[id]}) is missing from V${chapter.number}`);
    }
  }

  const titles = new Map<string, TestTitle[]>();
  const headings = new Map<string, string[]>();
  for (const row of parsed.rows) {
    for (const reference of row.references) {
      const problem = referenceProblem(reference, files, titles, headings);
      if (problem) report('reference', row, problem);
    }
  }
  return problems;
}

/** Why a reference does not hold, or undefined when it does. */
function referenceProblem(reference: ChecklistReference, files: ChecklistFiles, titles: Map<string, TestTitle[]>, headings: Map<string, string[]>): string | undefined {
  const { path, text } = reference;
  if (path.startsWith('/') || path.split('/').includes('..')) return `"${path}" must be a path inside the repository`;
  const isMarkdown = path.endsWith('.md');
  if (!isMarkdown && !TEST_FILE.test(path)) return `"${path}" is neither a test file (*.spec.ts, *.e2e.ts) nor a Markdown file`;
  if (!files.exists(path)) return `${path} does not exist`;
  if (isMarkdown) {
    if (!headings.has(path)) {
      headings.set(path, [...files.read(path).matchAll(/^#{1,6}\s+(.+?)\s*#*\s*$/gm)].map(([, heading]) => heading));
    }
    return headings.get(path)?.includes(text) ? undefined : `${path} has no heading "${text}"`;
  }
  if (!titles.has(path)) titles.set(path, testTitles(files.read(path)));
  const matching = (titles.get(path) ?? []).filter((title) => titleMatches(title, text));
  if (matching.length === 0) return `no it(...) titled "${text}" in ${path}`;
  if (matching.every((title) => title.isSkipped)) return `the test "${text}" in ${path} is skipped or a todo`;
  return undefined;
}
