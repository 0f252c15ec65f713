import type { Page } from 'playwright-core';

/** How a page fits its viewport sideways. */
export interface LayoutReport {
  readonly viewportWidth: number;
  /** `document.scrollingElement.scrollWidth`: wider than the viewport means the page scrolls sideways. */
  readonly pageScrollWidth: number;
  /** The shell's content pane (it scrolls on its own): how far its content sticks out to the right, px. */
  readonly paneOverflow: number;
  /** Visible tables in the main area, and which of them have no sideways-scrolling frame of their own. */
  readonly tableCount: number;
  readonly unframedTables: readonly string[];
}

/**
 * Measures the page: whole-page and content-pane overflow, and every visible table's frame. A
 * table is framed when an ancestor inside the content pane scrolls sideways (`overflow-x: auto`
 * or `scroll`), so a wide table scrolls within the page instead of widening it.
 */
export function layoutReport(page: Page): Promise<LayoutReport> {
  return page.evaluate(() => {
    const pane = document.querySelector('mat-sidenav-content');
    const main = document.querySelector('main') ?? document.body;
    const scrollsSideways = (element: Element): boolean => ['auto', 'scroll'].includes(getComputedStyle(element).overflowX);
    const tables = Array.from(main.querySelectorAll('table')).filter((table) => table.getClientRects().length > 0);
    const unframedTables = tables
      .filter((table) => {
        for (let element = table.parentElement; element && element !== pane && element !== document.body; element = element.parentElement) {
          if (scrollsSideways(element)) return false;
        }
        return true;
      })
      .map((table) => table.getAttribute('aria-label') ?? table.querySelector('caption')?.textContent?.trim() ?? table.className ?? 'table');
    return {
      viewportWidth: window.innerWidth,
      pageScrollWidth: document.scrollingElement?.scrollWidth ?? 0,
      paneOverflow: pane ? pane.scrollWidth - pane.clientWidth : 0,
      tableCount: tables.length,
      unframedTables,
    };
  });
}
