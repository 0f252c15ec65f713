import type { Browser } from 'playwright-core';
import { launchBrowser } from '../support/browser';
import { startServer, type RunningServer } from '../support/server';
import { auditLeadJourney } from './audit-lead.journey';
import { clinicianKeyboardJourney } from './clinician-keyboard.journey';
import { governancePackJourney } from './governance-pack.journey';
import { partnerReviewJourney } from './partner-review.journey';

/*
 * The four journeys of the people Tidemark is for, each one continuous story in its own file
 * (steps commented there), in headless Debian Chromium against one server with the demo practice.
 * They touch different records (a new audit; one due recall; a review note; the committee e-mail),
 * so sharing the server saves three start-ups without one journey leaning on another.
 * Screenshots land in test-results/journey-<n>-*.png.
 */
describe('the used-by journeys in Chromium', () => {
  let server: RunningServer;
  let browser: Browser;

  beforeAll(async () => {
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('1. the audit lead defines a cohort, a recall schedule and standards, and opens the results', async () => {
    await auditLeadJourney({ server, browser });
  });

  it('2. a clinician on a tablet enters a due recall by keyboard only and uploads a photograph with a progress bar', async () => {
    await clinicianKeyboardJourney({ server, browser });
  });

  it('3. a partner reviews rebound, narrows to thin phenotype and one operator, and leaves a review note', async () => {
    await partnerReviewJourney({ server, browser });
  });

  it('4. the committee is told the pack is ready; a governance member follows the e-mail and downloads it', async () => {
    await governancePackJourney({ server, browser });
  });
});
