import type { CaseDetail, RecallDueItem, RecallDueList } from '@tidemark/shared';
import type { Locator, Page } from 'playwright-core';
import { screenshotWholePage } from '../support/whole-page-screenshot';
import { DEMO_ACCOUNTS, signIn } from '../support/sign-in';
import { generateClinicalPhoto } from './support/clinical-photo';
import { enterForFileChooser, focused, pressAndLook, pressUntilFocused } from './support/keyboard-focus';
import { watchProblems } from '../support/page-problems';
import { newJourneyContext, pictureOnFailure, type JourneyWorld } from './support/journey-kit';
import { progressSeen, recordProgress, throttleUploads } from './support/upload-progress';

/** Reads "10.0 mm" as 10 (null for a dash). */
function millimetres(text: string): number | null {
  const match = /(\d+(?:\.\d+)?) mm/.exec(text);
  return match ? Number(match[1]) : null;
}

/** Of the recalls in their window, the one with the most teeth: the most rows to cross by keyboard. */
async function busiestDueRecall(page: Page, baseUrl: string): Promise<RecallDueItem> {
  const due = (await (await page.request.get(`${baseUrl}/api/recalls/due`)).json()) as RecallDueList;
  const busiest = [...due.inWindow].sort((a, b) => b.teeth.length - a.teeth.length)[0];
  if (!busiest) throw new Error('The demo practice has no recall in its window today.');
  return busiest;
}

/** Types one site row from its REF→GM field on, by keyboard only, checking focus at each field. */
async function typeSiteRow(page: Page, row: Locator, rowName: string, index: number): Promise<number> {
  const [baseline, postOp] = (await row.getByRole('definition').allInnerTexts()).map(millimetres);
  // Half a millimetre of rebound where the margin was recorded after surgery; a plausible gain otherwise.
  const refGm = postOp !== null && postOp !== undefined ? postOp - 0.5 : (baseline ?? 8) + 1;
  expect(await focused(page)).toEqual(expect.objectContaining({ name: 'REF→GM', within: rowName }));
  await page.keyboard.type(String(refGm));
  if (postOp !== null && postOp !== undefined) {
    // The outcome follows the keystrokes: rebound = post-op − recall = +0.5 mm (DESIGN.md §3).
    await row.getByText(/Rebound\s*\+0\.5 mm/).waitFor();
  }
  expect(await pressAndLook(page, 'Tab')).toEqual(expect.objectContaining({ name: 'Probing', within: rowName }));
  await page.keyboard.type('2');
  expect(await pressAndLook(page, 'Tab')).toEqual(expect.objectContaining({ name: 'BOP', within: rowName }));
  if (index % 2 === 0) await page.keyboard.press('Space');
  expect(await pressAndLook(page, 'Tab')).toEqual(expect.objectContaining({ name: 'KT width', within: rowName }));
  await page.keyboard.type('3');
  if ((await row.getByLabel('Papilla 0–4').count()) > 0) {
    expect(await pressAndLook(page, 'Tab')).toEqual(expect.objectContaining({ name: 'Papilla 0–4', within: rowName }));
    await page.keyboard.type('3');
  }
  return refGm;
}

/**
 * Journey 2: a clinician at the chair, on a 1024 × 768 tablet, keyboard only from Today: opens a
 * due recall, enters every measured outcome, saves, then adds a photograph and watches it upload.
 */
export async function clinicianKeyboardJourney(world: JourneyWorld): Promise<void> {
  const context = await newJourneyContext(world, { viewport: { width: 1024, height: 768 } });
  const page = await context.newPage();
  const problems = watchProblems(page);
  const photo = await generateClinicalPhoto();
  try {
    // Step 1: the clinician signs in and lands on Today.
    await signIn(page, world.server.baseUrl, DEMO_ACCOUNTS.clinician);
    await page.waitForURL(/\/today$/);
    await page.getByRole('region', { name: /In window now/ }).waitFor();
    const recall = await busiestDueRecall(page, world.server.baseUrl);
    await screenshotWholePage(page, 'journey-2-today-tablet');

    // Step 2: Tab from the top of Today through the toolbar and the group counts to the recall's
    // "Enter recall" button; every stop on the way is something a person can name.
    const target = new RegExp(`^Enter recall for ${recall.patientCode}, ${recall.intervalLabel}$`);
    const stops = await pressUntilFocused(page, 'Tab', target, 80);
    expect(stops.every((stop) => stop.name.length > 0)).toBe(true);
    expect(stops.map((stop) => stop.name)).toContain('Menu');
    // Shift+Tab steps back, Tab returns: focus moves both ways.
    expect((await pressAndLook(page, 'Shift+Tab')).name).not.toMatch(target);
    expect((await pressAndLook(page, 'Tab')).name).toMatch(target);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/cases\/\d+\/recall\/\w+$/);
    const [, caseId, intervalKey] = /\/cases\/(\d+)\/recall\/(\w+)$/.exec(page.url()) ?? [];
    await page.getByRole('heading', { level: 1, name: /recall ·/ }).waitFor();
    const rows = page.getByRole('group', { name: /^Tooth / });
    await rows.first().waitFor();

    // Step 3: the visit itself: the date stays today's; pain, satisfaction and a note are typed.
    const toPain = await pressUntilFocused(page, 'Tab', /^Pain 0–10$/, 8);
    expect(toPain.slice(0, -1).every((stop) => stop.name === 'Visit date')).toBe(true);
    await page.keyboard.type('1');
    expect((await pressAndLook(page, 'Tab')).name).toBe('Satisfaction 0–10');
    await page.keyboard.type('9');
    expect((await pressAndLook(page, 'Tab')).name).toBe('Notes');
    await page.keyboard.type('Healing well; margins even with the planned smile line.');

    // Step 4: every site row, field by field; Enter moves on like Tab and never saves.
    const rowNames = await rows.evaluateAll((groups) => groups.map((group) => group.getAttribute('aria-label') ?? ''));
    expect(rowNames.length).toBeGreaterThan(1);
    await page.keyboard.press('Tab');
    const typed: number[] = [];
    for (const [index, rowName] of rowNames.entries()) {
      typed.push(await typeSiteRow(page, rows.nth(index), rowName, index));
      await page.keyboard.press('Enter');
    }
    expect(page.url()).toMatch(/\/recall\//);
    await screenshotWholePage(page, 'journey-2-recall-entry-tablet');

    // Step 5: on to "Save recall" and press it; a reading more than 3 mm from the last asks first.
    await pressUntilFocused(page, 'Tab', /Save recall/, 6);
    const landed = page.waitForURL(new RegExp(`/cases/${caseId}$`));
    await page.keyboard.press('Enter');
    const confirm = page.getByRole('dialog', { name: 'Check the reference point' });
    if (await confirm.waitFor({ timeout: 5_000 }).then(() => true, () => false)) {
      await pressUntilFocused(page, 'Tab', /Readings are right/, 4);
      await page.keyboard.press('Enter');
    }
    await landed;
    const saved = (await (await page.request.get(`${world.server.baseUrl}/api/cases/${caseId}`)).json()) as CaseDetail;
    const visit = saved.visits.find((each) => each.intervalKey === intervalKey);
    expect(visit?.measurements).toHaveLength(rowNames.length);
    expect(visit?.measurements.map((measurement) => measurement.refGm).sort()).toEqual([...typed].sort());
    expect(visit?.measurements.every((measurement) => measurement.probingDepth === 2 && measurement.ktWidth === 3)).toBe(true);
    expect([visit?.pain, visit?.satisfaction]).toEqual([1, 9]);
    await page.getByRole('link', { name: `Correct the ${recall.intervalLabel} recall` }).waitFor();

    // Step 6: to the Photographs tab: Tab to the tab list, arrow across, Enter.
    await pressUntilFocused(page, 'Tab', /^Margin record$/, 30);
    const photographsTab = await pressAndLook(page, 'ArrowRight');
    expect(photographsTab).toEqual(expect.objectContaining({ role: 'tab', name: expect.stringMatching(/^Photographs \(\d+\)$/) }));
    const before = Number(/\((\d+)\)/.exec(photographsTab.name)?.[1]);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: 'Add a photograph' }).waitFor();

    // Step 7: "Shows" stays "At recall"; "Taken at recall" is set to this visit with the arrow keys.
    expect(await pressAndLook(page, 'Tab')).toEqual(expect.objectContaining({ role: 'combobox', name: expect.stringMatching(/^Shows/) }));
    const takenAt = await pressAndLook(page, 'Tab');
    expect(takenAt).toEqual(expect.objectContaining({ role: 'combobox', name: expect.stringMatching(/^Taken at recall/) }));
    await page.keyboard.press('Enter');
    const listbox = page.getByRole('listbox', { name: 'Taken at recall' });
    await listbox.waitFor();
    // The open list keeps focus on the select and points at the active option (aria-activedescendant).
    const activeOption = () => page.evaluate(() => document.getElementById(document.activeElement?.getAttribute('aria-activedescendant') ?? '')?.textContent?.trim() ?? '');
    for (let press = 0; press < 8 && (await activeOption()) !== recall.intervalLabel; press++) await page.keyboard.press('ArrowDown');
    expect(await activeOption()).toBe(recall.intervalLabel);
    await page.keyboard.press('Enter');
    await listbox.waitFor({ state: 'detached' });
    expect((await focused(page)).name).toMatch(/^Taken at recall/);
    await expect(page.getByRole('combobox', { name: 'Taken at recall' }).innerText()).resolves.toBe(recall.intervalLabel);

    // Step 8: "Choose photograph" opens the system file picker from the keyboard; the generated photo is picked there.
    await pressUntilFocused(page, 'Tab', /Choose photograph/, 5);
    await (await enterForFileChooser(page)).setFiles(photo.path);
    await page.getByText('upper-front-recall.jpg').waitFor();
    expect(await pressAndLook(page, 'Tab')).toEqual(expect.objectContaining({ name: 'Upload' }));

    // Step 9: upload on a slow line, so the determinate bar is seen moving, then finishing.
    const unthrottle = await throttleUploads(context, page, Math.ceil(photo.bytes / 3));
    await recordProgress(page, 'Upload progress');
    await page.keyboard.press('Enter');
    const bar = page.getByRole('progressbar', { name: 'Upload progress' });
    await bar.waitFor();
    await page.waitForFunction(() => {
      const value = Number(document.querySelector('[role="progressbar"][aria-label="Upload progress"]')?.getAttribute('aria-valuenow'));
      return value > 0 && value < 100;
    });
    await screenshotWholePage(page, 'journey-2-photo-uploading');
    await page.getByText(/upper-front-recall\.jpg was uploaded as “At recall”/).waitFor();
    await unthrottle();
    const seen = await progressSeen(page);
    expect(seen.some((value) => value !== null && value > 0 && value < 100)).toBe(true);
    const numbers = seen.filter((value): value is number => value !== null);
    expect(numbers).toEqual([...numbers].sort((a, b) => a - b));
    expect(numbers.at(-1)).toBe(100);
    await bar.waitFor({ state: 'detached' });

    // Step 10: the photograph is on the case page, labelled with this recall, and its image loads.
    await page.getByRole('tab', { name: `Photographs (${before + 1})` }).waitFor();
    const tile = page.getByRole('button', { name: new RegExp(`At recall.*${recall.intervalLabel} recall`) }).first();
    await tile.waitFor();
    await page.waitForFunction(() => Array.from(document.images).some((image) => image.alt.startsWith('At recall') && image.complete && image.naturalWidth > 0));
    await screenshotWholePage(page, 'journey-2-case-photographs');
    const overflow = await page.locator('mat-sidenav-content').evaluate((pane) => pane.scrollWidth - pane.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    expect(problems).toEqual([]);
  } catch (error) {
    await pictureOnFailure(page, 'journey-2', error);
  } finally {
    await context.close();
  }
}
