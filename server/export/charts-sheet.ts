import type ExcelJS from 'exceljs';
import type { Style } from 'exceljs';
import { CHART_PALETTE } from './chart-palette';
import type { SheetPicture } from './drawing-parts';
import type { RenderedChart } from './governance-charts';
import { argb, BASE_FONT, WRAP_STYLE } from './table-sheet';

/** The sheet that receives the pictures once the workbook is written. */
export const CHARTS_SHEET_NAME = 'Charts';

/** Default row height in pixels (15 pt at 96 dpi). */
const ROW_PX = 20;
const TITLE_STYLE: Partial<Style> = { font: { ...BASE_FONT, bold: true, size: 14, color: { argb: argb(CHART_PALETTE.teal) } } };

/**
 * The Charts sheet: a note and, for each chart, its title and a caption in words, with room below
 * for the picture. exceljs' streaming writer cannot place images (worksheet.addImage exists only
 * on the in-memory workbook), so the pictures are added to the finished file by addSheetImages;
 * this returns where each goes.
 */
export function writeChartsSheet(workbook: ExcelJS.stream.xlsx.WorkbookWriter, charts: readonly RenderedChart[]): SheetPicture[] {
  const sheet = workbook.addWorksheet(CHARTS_SHEET_NAME, {
    properties: { tabColor: { argb: argb(CHART_PALETTE.sand) } },
    // Landscape A4 holds one 880-pixel chart across at full size.
    pageSetup: { orientation: 'landscape', fitToPage: true, fitToWidth: 1, fitToHeight: 0, paperSize: 9 },
  });
  sheet.columns = [{ width: 110 }];
  const note = sheet.addRow(['Pictures of three key figures. The numbers behind each are on the sheet its caption names; the pictures carry labels and line styles as well as colours.']);
  note.getCell(1).style = WRAP_STYLE;
  note.commit();
  const pictures: SheetPicture[] = [];
  // 1-based number of the next row to be added.
  let rowNumber = 2;
  for (const chart of charts) {
    sheet.addRow([]).commit();
    const title = sheet.addRow([chart.title]);
    title.getCell(1).style = TITLE_STYLE;
    title.commit();
    const caption = sheet.addRow([chart.description]);
    caption.getCell(1).style = WRAP_STYLE;
    caption.height = 30;
    caption.commit();
    rowNumber += 3;
    // The picture's top-left is the row after the caption; drawings count rows from 0.
    pictures.push({ png: chart.png, description: `${chart.title}: ${chart.description}`, col: 0, row: rowNumber - 1, widthPx: chart.size.width, heightPx: chart.size.height });
    const rowsUnderPicture = Math.ceil(chart.size.height / ROW_PX) + 1;
    for (let index = 0; index < rowsUnderPicture; index += 1) {
      const spacer = sheet.addRow([]);
      // Printed, each chart starts on a page of its own.
      if (index === rowsUnderPicture - 1) spacer.addPageBreak();
      spacer.commit();
    }
    rowNumber += rowsUnderPicture;
  }
  sheet.commit();
  return pictures;
}
