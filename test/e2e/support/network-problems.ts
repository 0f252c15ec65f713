import type { Page } from 'playwright-core';

/** What went wrong on the wire while a page ran. */
export interface NetworkProblems {
  /** Requests that got no answer at all (refused, reset, blocked), as `METHOD /path: reason`. */
  readonly failedRequests: string[];
  /** Answers with a 4xx or 5xx status, as `STATUS METHOD /path`, in the order they came. */
  readonly errorAnswers: string[];
}

/**
 * Records, from now on, requests of the page that failed and answers with an error status.
 * Unlike the console, this sees every refusal, so a spec can name exactly which ones it expects.
 */
export function watchNetwork(page: Page): NetworkProblems {
  const problems: NetworkProblems = { failedRequests: [], errorAnswers: [] };
  page.on('requestfailed', (request) => {
    problems.failedRequests.push(`${request.method()} ${new URL(request.url()).pathname}: ${request.failure()?.errorText ?? 'failed'}`);
  });
  page.on('response', (response) => {
    if (response.status() >= 400) {
      problems.errorAnswers.push(`${response.status()} ${response.request().method()} ${new URL(response.url()).pathname}`);
    }
  });
  return problems;
}
