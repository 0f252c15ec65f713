import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { checkAsvsChecklist, type ChecklistFiles, type ChecklistProblemKind } from './asvs-checklist';
import { ASVS_CHAPTERS, type AsvsChapter } from './asvs-requirements';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const CHECKLIST = 'docs/asvs-5.0-l2.md';

const repositoryFiles: ChecklistFiles = {
  exists: (file) => existsSync(path.join(ROOT, file)),
  read: (file) => readFileSync(path.join(ROOT, file), 'utf8'),
};

describe(`${CHECKLIST}: the OWASP ASVS 5.0 Level 2 checklist`, () => {
  const problems = checkAsvsChecklist(repositoryFiles.read(CHECKLIST), ASVS_CHAPTERS, repositoryFiles);
  const messages = (kind: ChecklistProblemKind) => problems.filter((problem) => problem.kind === kind).map((problem) => problem.message);

  it('has one table per chapter, each with the agreed columns', () => {
    expect(messages('format')).toEqual([]);
  });

  // Source of the ids and levels: the ASVS 5.0.0 release (see asvs-requirements.ts).
  it('lists every Level 1 and Level 2 requirement of its chapters once, at its level', () => {
    expect(messages('coverage')).toEqual([]);
  });

  it('gives every row an allowed status and a proof or a reason, and proves every "met"', () => {
    expect(messages('status')).toEqual([]);
  });

  it('points only at test files that exist and it(...) titles that run in them, or at Markdown headings that exist', () => {
    expect(messages('reference')).toEqual([]);
  });
});

describe('the checklist checker catches rot', () => {
  const header = '| id | level | requirement (short) | status | proof (file › test title) or reason |\n|---|---|---|---|---|';
  const V8: AsvsChapter = { number: 8, name: 'Authorization', requirements: { '8.1.1': 1, '8.2.3': 2 } };
  const files = (contents: Record<string, string>): ChecklistFiles => ({ exists: (file) => file in contents, read: (file) => contents[file] ?? '' });
  const SPEC = "describe('x', () => {\n  it('refuses another operator', () => {});\n  it.skip('is not written yet', () => {});\n  it(`${role} gets ${status}`, () => {});\n});\n";
  const check = (rows: string, contents: Record<string, string> = { 'test/api/x.api.spec.ts': SPEC, 'docs/d.md': '# Doc\n\n## Roles\n' }) =>
    checkAsvsChecklist(`# Checklist\n\n## V8 Authorization\n\n${header}\n${rows}\n`, [V8], files(contents)).map((problem) => `${problem.kind}: ${problem.message}`);
  const ROW_8_1_1 = '| v5.0.0-8.1.1 | 1 | Documented access rules | met | `docs/d.md` › `Roles` |';

  it('accepts rows whose proofs exist, including a template title with its ${…} parts filled in', () => {
    expect(check(`${ROW_8_1_1}\n| v5.0.0-8.2.3 | 2 | Field-level access | met | \`test/api/x.api.spec.ts\` › \`partner gets 403\` |`)).toEqual([]);
  });

  it('reports a missing test file, an unknown it title, a skipped test and a heading that is not there', () => {
    const problems = check(
      '| v5.0.0-8.1.1 | 1 | Documented access rules | met | `docs/d.md` › `Who sees what` |\n' +
        '| v5.0.0-8.2.3 | 2 | Field-level access | met | `test/api/gone.api.spec.ts` › `refuses another operator`; `test/api/x.api.spec.ts` › `refuses another person`; `test/api/x.api.spec.ts` › `is not written yet` |',
    );
    expect(problems).toEqual([
      'reference: line 7, v5.0.0-8.1.1: docs/d.md has no heading "Who sees what"',
      'reference: line 8, v5.0.0-8.2.3: test/api/gone.api.spec.ts does not exist',
      'reference: line 8, v5.0.0-8.2.3: no it(...) titled "refuses another person" in test/api/x.api.spec.ts',
      'reference: line 8, v5.0.0-8.2.3: the test "is not written yet" in test/api/x.api.spec.ts is skipped or a todo',
    ]);
  });

  it('reports a row with neither proof nor reason, a "met" without proof and an unknown status', () => {
    const problems = check(`| v5.0.0-8.1.1 | 1 | Documented access rules | partly | — |\n| v5.0.0-8.2.3 | 2 | Field-level access | met | the service strips the fields |`);
    expect(problems).toEqual(['status: line 7, v5.0.0-8.1.1: has neither a proof (`file` › `title`) nor a reason', 'status: line 8, v5.0.0-8.2.3: is met, so it needs a proof (`file` › `title`)']);
    expect(check(`${ROW_8_1_1}\n| v5.0.0-8.2.3 | 2 | Field-level access | done | \`test/api/x.api.spec.ts\` › \`refuses another operator\` |`)).toEqual([
      'status: line 8, v5.0.0-8.2.3: status "done" is not one of met, partly, not met, n/a, deployment',
    ]);
  });

  it('reports a missing, a repeated, a Level 3 and a mis-levelled requirement', () => {
    const problems = check(`${ROW_8_1_1}\n${ROW_8_1_1.replace('| 1 |', '| 2 |')}\n| v5.0.0-8.1.3 | 3 | Contextual attributes documented | n/a | no adaptive controls at all |`);
    expect(problems).toEqual([
      'coverage: line 8, v5.0.0-8.1.1: is listed twice',
      'coverage: line 8, v5.0.0-8.1.1: level is 2, ASVS 5.0.0 says 1',
      'coverage: line 9, v5.0.0-8.1.3: is not a Level 1 or 2 requirement of ASVS 5.0.0 in this chapter',
      'coverage: v5.0.0-8.2.3 (level 2) is missing from V8',
    ]);
  });

  it('reports a test file named without the title of one of its tests', () => {
    expect(check(`${ROW_8_1_1}\n| v5.0.0-8.2.3 | 2 | Field-level access | met | see \`test/api/x.api.spec.ts\` |`)).toEqual([
      'format: line 8: v5.0.0-8.2.3 names test/api/x.api.spec.ts without an it(...) title (`file` › `title`)',
      'status: line 8, v5.0.0-8.2.3: is met, so it needs a proof (`file` › `title`)',
    ]);
  });

  it('reports a missing chapter and a table in the wrong shape', () => {
    const problems = checkAsvsChecklist('# Checklist\n\n## V8 Authorization\n\n| id | status |\n|---|---|\n| v5.0.0-8.1.1 | met |\n', [V8, { ...V8, number: 7, name: 'Session Management', requirements: {} }], files({}));
    expect(problems.map((problem) => problem.message)).toEqual([
      `line 5: table header is "id | status", expected "id | level | requirement (short) | status | proof (file › test title) or reason"`,
      'line 7: row has 2 cells, expected 5',
      'chapter heading "## V7 Session Management" is missing',
      'v5.0.0-8.1.1 (level 1) is missing from V8',
      'v5.0.0-8.2.3 (level 2) is missing from V8',
    ]);
  });
});
