import { once } from 'node:events';
import { rm } from 'node:fs/promises';
import ExcelJS from 'exceljs';
import { writeActionPlanSheet } from './action-plan-sheet';
import { addSheetImages } from './add-sheet-images';
import { CHARTS_SHEET_NAME, writeChartsSheet } from './charts-sheet';
import { writeComplicationsSheet } from './complications-sheet';
import { writeCriteriaSheet } from './criteria-sheet';
import { writeFrontPage } from './front-page-sheet';
import { renderGovernanceCharts } from './governance-charts';
import type { GovernancePack } from './governance-pack';
import { writeMarginOutcomesSheet } from './margin-outcomes-sheet';
import { writeMethodNotesSheet } from './method-notes-sheet';
import { writePapillaSheet } from './papilla-sheet';
import { writeRecallSheet } from './recall-sheet';
import { writeSiteDataSheet } from './site-data-sheet';
import { SyncFileSink } from './sync-file-sink';

/** Progress of a workbook being written: a fraction 0–1 and the site rows written so far. */
export type WorkbookProgress = (progress: number, rows: number) => void;

/** Where the writer works. */
export interface WorkbookFiles {
  /** The streaming writer's output, deleted once the pictures are in. */
  stagePath: string;
  /** The finished workbook. */
  targetPath: string;
}

/** Shares of the job spent before, during and after the site rows (they dominate large exports). */
const BEFORE_ROWS = 0.1;
const AFTER_ROWS = 0.9;

/**
 * Writes the governance workbook: every sheet through exceljs' streaming writer (real number
 * formats, shared strings off so memory does not grow with the rows), then the three chart
 * pictures added to the Charts sheet by re-zipping the file entry by entry. The stage file is
 * stored uncompressed so that the data are deflated once, in the final zip, and written
 * synchronously (SyncFileSink) so that rows never pile up in memory behind the disk.
 */
export async function writeGovernanceWorkbook(pack: GovernancePack, files: WorkbookFiles, onProgress: WorkbookProgress = () => undefined): Promise<void> {
  const charts = renderGovernanceCharts(pack);
  onProgress(0.05, 0);
  const stage = new SyncFileSink(files.stagePath);
  const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({ stream: stage, useStyles: true, useSharedStrings: false, zip: { store: true } });
  workbook.creator = 'Tidemark';
  try {
    writeFrontPage(workbook, pack);
    writeCriteriaSheet(workbook, pack.results.standards, pack.results.schedule);
    writeMarginOutcomesSheet(workbook, pack.subgroups);
    writePapillaSheet(workbook, pack.subgroups);
    writeComplicationsSheet(workbook, pack.subgroups, pack.complicationFunnel);
    writeRecallSheet(workbook, pack.results.summary.recall, pack.results.schedule);
    writeActionPlanSheet(workbook, pack.actions);
    onProgress(BEFORE_ROWS, 0);
    const total = Math.max(1, pack.siteData.count);
    await writeSiteDataSheet(workbook, pack.siteData, (rows) => onProgress(BEFORE_ROWS + (AFTER_ROWS - BEFORE_ROWS) * (rows / total), rows));
    writeMethodNotesSheet(workbook, pack.results.thresholds);
    const pictures = writeChartsSheet(workbook, charts);
    await workbook.commit();
    if (!stage.writableFinished) await once(stage, 'finish');
    onProgress(AFTER_ROWS + 0.02, pack.siteData.count);
    await addSheetImages({ source: files.stagePath, target: files.targetPath, sheetName: CHARTS_SHEET_NAME, pictures });
    onProgress(1, pack.siteData.count);
  } finally {
    // On failure the stage may still be open; its file goes either way.
    if (!stage.writableFinished) stage.destroy();
    await rm(files.stagePath, { force: true });
  }
}
