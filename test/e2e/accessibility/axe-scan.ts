import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type axe from 'axe-core';
import type { Page } from 'playwright-core';

declare global {
  interface Window {
    axe?: typeof axe;
  }
}

/** axe-core's own build, injected into the page under test (the context must bypass the app's CSP). */
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

/** WCAG 2.0 and 2.1, levels A and AA (axe-core rule tags, https://github.com/dequelabs/axe-core/blob/develop/doc/API.md#axe-core-tags). */
export const WCAG_21_AA_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] as const;

/** Impacts that fail the run; axe-core ranks impact minor < moderate < serious < critical. */
const BLOCKING_IMPACTS: readonly string[] = ['serious', 'critical'];

/** One axe violation, reduced to what a person fixing it needs. */
export interface AxeFinding {
  readonly rule: string;
  readonly impact: string;
  readonly help: string;
  /** CSS selectors of the first offending nodes. */
  readonly targets: readonly string[];
  /** axe's "Fix any of the following" summary of the first node. */
  readonly summary: string;
}

/** Runs axe-core on the whole document (dialogs in the overlay container included) and returns every violation. */
export async function axeViolations(page: Page): Promise<AxeFinding[]> {
  if (!(await page.evaluate(() => typeof window.axe === 'object'))) {
    await page.addScriptTag({ content: AXE_SOURCE });
  }
  return page.evaluate(async (tags) => {
    const engine = window.axe;
    if (!engine) throw new Error('axe-core did not load into the page.');
    // Only violations are collected: gathering passes costs most of a run on large pages.
    const results = await engine.run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] });
    return results.violations.map((violation) => ({
      rule: violation.id,
      impact: violation.impact ?? 'unknown',
      help: violation.help,
      targets: violation.nodes.slice(0, 4).map((node) => node.target.join(' ')),
      summary: (violation.nodes[0]?.failureSummary ?? '').replace(/\s+/g, ' ').trim(),
    }));
  }, [...WCAG_21_AA_TAGS]);
}

/** The violations that fail the run. */
export function blocking(findings: readonly AxeFinding[]): AxeFinding[] {
  return findings.filter((finding) => BLOCKING_IMPACTS.includes(finding.impact));
}

/** One line per finding: where, which rule, on which nodes, and axe's summary. */
export function describeFindings(where: string, findings: readonly AxeFinding[]): string[] {
  return findings.map((finding) => `${where}: [${finding.impact}] ${finding.rule} (${finding.help}) at ${finding.targets.join(' | ')} — ${finding.summary}`);
}
