import type { Page } from 'playwright-core';

/**
 * Collects console errors and page errors from now on, other than the expected 401 of
 * "who am I?" before sign-in. The returned list fills as the page runs.
 */
export function watchProblems(page: Page): string[] {
  const problems: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error' && !/status of 401/.test(message.text())) problems.push(message.text());
  });
  page.on('pageerror', (error) => problems.push(error.message));
  return problems;
}
