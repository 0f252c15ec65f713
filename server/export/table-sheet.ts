import type ExcelJS from 'exceljs';
import type { CellValue, Style, Worksheet } from 'exceljs';
import { CHART_PALETTE } from './chart-palette';

/** Real Excel number formats: values stay numbers, so the committee can sort, filter and compute. */
export const NUMBER_FORMATS = {
  /** A probe reading, mm (0.5 mm steps). */
  mm: '0.0',
  /** A mean or interval limit in mm. */
  meanMm: '0.00',
  /** A share stored as a fraction (0.825 shows as 82.5%). */
  share: '0.0%',
  count: '0',
  /** A papilla score or a mean of scores. */
  score: '0.00',
  date: 'd mmm yyyy',
} as const;
export type NumberFormat = keyof typeof NUMBER_FORMATS;

/** Hex colour → exceljs ARGB. */
export function argb(hex: string): string {
  return `FF${hex.slice(1).toUpperCase()}`;
}

/** A solid fill. */
export function solidFill(hex: string): ExcelJS.Fill {
  return { type: 'pattern', pattern: 'solid', fgColor: { argb: argb(hex) } };
}

/**
 * Shared style objects. exceljs caches a style by object identity, so handing every cell of a
 * column the same object keeps 100,000-row sheets fast; never mutate these.
 */
export const CELL_STYLES: Readonly<Record<NumberFormat, Partial<Style>>> = {
  mm: { numFmt: NUMBER_FORMATS.mm, alignment: { vertical: 'top' } },
  meanMm: { numFmt: NUMBER_FORMATS.meanMm, alignment: { vertical: 'top' } },
  share: { numFmt: NUMBER_FORMATS.share, alignment: { vertical: 'top' } },
  count: { numFmt: NUMBER_FORMATS.count, alignment: { vertical: 'top' } },
  score: { numFmt: NUMBER_FORMATS.score, alignment: { vertical: 'top' } },
  date: { numFmt: NUMBER_FORMATS.date, alignment: { horizontal: 'left', vertical: 'top' } },
};

/** Plain text beside wrapped text: aligned to the top like it. */
export const TOP_STYLE: Partial<Style> = { alignment: { vertical: 'top' } };

/**
 * Plain cells get this shared empty style too: a cell left with its own fresh style object makes
 * exceljs serialise that style to look it up, which dominates the time of a 100,000-row sheet.
 */
export const PLAIN_STYLE: Partial<Style> = {};

/**
 * The font every styled cell names. A font left without a name makes LibreOffice fall back to a
 * serif face, and Calibri is what exceljs gives unstyled cells.
 */
export const BASE_FONT: Partial<ExcelJS.Font> = { name: 'Calibri', family: 2, size: 11 };

/** The header row of every table: white on teal, wrapped. */
export const HEADER_STYLE: Partial<Style> = {
  font: { ...BASE_FONT, bold: true, color: { argb: argb(CHART_PALETTE.paper) } },
  fill: solidFill(CHART_PALETTE.teal),
  alignment: { vertical: 'middle', wrapText: true },
  border: { bottom: { style: 'thin', color: { argb: argb(CHART_PALETTE.ink) } } },
};

/** Long text that should wrap in its column. */
export const WRAP_STYLE: Partial<Style> = { alignment: { vertical: 'top', wrapText: true } };

/** Height of one wrapped line of 11 pt text, in points. */
const LINE_PT = 15;

/**
 * A row height that shows wrapped text whole. Spreadsheet programs do not reliably grow rows
 * written without a height, so the writer estimates it: about one character per unit of column
 * width (a cautious guess; a little space to spare beats cut-off text).
 */
export function wrappedRowHeight(cells: readonly { text: string; width: number }[], charactersPerUnit = 1.05): number {
  let lines = 1;
  for (const { text, width } of cells) {
    const perLine = Math.max(1, Math.floor(width * charactersPerUnit));
    const count = text.split('\n').reduce((sum, paragraph) => sum + Math.max(1, Math.ceil(paragraph.length / perLine)), 0);
    lines = Math.max(lines, count);
  }
  return lines * LINE_PT;
}

/** Page set-up of table sheets: landscape, as wide as one page, header row repeated on each page. */
export const TABLE_PAGE_SETUP: Partial<ExcelJS.PageSetup> = { orientation: 'landscape', fitToPage: true, fitToWidth: 1, fitToHeight: 0, printTitlesRow: '1:1', paperSize: 9 };

/** One column of a table sheet. */
export interface TableColumn<Row> {
  header: string;
  /** Width in characters. */
  width: number;
  format?: NumberFormat;
  /** Wrap long text (criteria, actions). */
  isWrapped?: boolean;
  value(row: Row): CellValue;
  /** A style for this cell alone (e.g. a verdict's fill); must be a shared object too. */
  styleOf?(row: Row): Partial<Style> | null;
}

/** A table being written: rows go straight to the file. */
export interface TableSheet<Row> {
  readonly worksheet: Worksheet;
  addRow(row: Row): void;
  /** Rows written so far (header excluded). */
  readonly rowCount: number;
  commit(): void;
}

/**
 * Starts a data sheet on a streaming workbook: header row frozen at the top (and the first
 * `frozenColumns` columns at the left), column widths, an autoFilter over the header, and a real
 * number format on every numeric cell. Each row is committed as it is added, so the writer keeps
 * none of them.
 */
export function startTableSheet<Row>(workbook: ExcelJS.stream.xlsx.WorkbookWriter, name: string, columns: readonly TableColumn<Row>[], frozenColumns = 0): TableSheet<Row> {
  const worksheet = workbook.addWorksheet(name, {
    views: [{ state: 'frozen', xSplit: frozenColumns, ySplit: 1 }],
    properties: { tabColor: { argb: argb(CHART_PALETTE.teal) } },
    pageSetup: TABLE_PAGE_SETUP,
  });
  worksheet.columns = columns.map((column) => ({ width: column.width }));
  worksheet.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: columns.length } };
  const header = worksheet.addRow(columns.map((column) => column.header));
  header.eachCell((cell) => {
    cell.style = HEADER_STYLE;
  });
  // Bold header text is wider than body text.
  header.height = Math.max(32, wrappedRowHeight(columns.map((column) => ({ text: column.header, width: column.width })), 0.85));
  header.commit();
  const wrapped = columns.flatMap((column, index) => (column.isWrapped ? [{ index, width: column.width }] : []));
  // Tables with wrapped text have tall rows: everything is aligned to the top so values stay level.
  const textStyle = wrapped.length ? TOP_STYLE : PLAIN_STYLE;
  const styles = columns.map((column) => (column.format ? CELL_STYLES[column.format] : column.isWrapped ? WRAP_STYLE : textStyle));
  let rowCount = 0;
  return {
    worksheet,
    get rowCount() {
      return rowCount;
    },
    addRow(row: Row) {
      const values = columns.map((column) => column.value(row));
      const added = worksheet.addRow(values);
      if (wrapped.length) added.height = wrappedRowHeight(wrapped.map(({ index, width }) => ({ text: String(values[index] ?? ''), width })));
      columns.forEach((column, index) => {
        // An empty cell is left unwritten, as exceljs leaves it without a style.
        if (values[index] === null || values[index] === undefined) return;
        added.getCell(index + 1).style = column.styleOf?.(row) ?? styles[index];
      });
      added.commit();
      rowCount += 1;
    },
    commit() {
      worksheet.commit();
    },
  };
}

/** A fraction for a '0.0%' cell from a 0–100 percentage (null stays empty). */
export function fractionOfPercent(percent: number | null | undefined): number | null {
  return percent === null || percent === undefined ? null : percent / 100;
}

/** A real date cell from an ISO date (UTC midnight: Excel stores days, exceljs converts in UTC). */
export function dateCell(isoDate: string | null): Date | null {
  return isoDate ? new Date(`${isoDate}T00:00:00Z`) : null;
}
