/** One record of a delimited text file with its 1-based record number (the header is record 1). */
export interface CsvRecord {
  row: number;
  cells: string[];
}

/** A malformed CSV (an unclosed quote), reported with the record where it starts. */
export class CsvFormatError extends Error {
  constructor(
    readonly row: number,
    message: string,
  ) {
    super(message);
    this.name = 'CsvFormatError';
  }
}

/** Comma, or semicolon when the header uses it (spreadsheets in comma-decimal locales save that way). */
export function sniffDelimiter(text: string): ',' | ';' {
  const firstLine = text.slice(0, text.search(/\r?\n|$/));
  return firstLine.includes(';') && !firstLine.includes(',') ? ';' : ',';
}

/**
 * Parses CSV text (RFC 4180): quoted fields may hold delimiters, doubled quotes and line breaks;
 * CRLF or LF ends a record; a UTF-8 byte-order mark is dropped. Records are numbered as a
 * spreadsheet shows them (a line break inside quotes stays in its record), so error messages
 * point at the row the person sees.
 *
 * @throws {CsvFormatError} on a quote that never closes
 */
export function parseCsv(text: string): CsvRecord[] {
  const source = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const delimiter = sniffDelimiter(source);
  // Most exports quote nothing: then lines and cells split directly, several times faster.
  if (!source.includes('"')) {
    const lines = source.split(/\r\n|\n|\r/);
    if (lines[lines.length - 1] === '') lines.pop();
    return lines.map((line, index) => ({ row: index + 1, cells: line.split(delimiter) }));
  }
  const records: CsvRecord[] = [];
  let cells: string[] = [];
  let field = '';
  let isQuoted = false;
  let quoteStartRow = 0;
  let index = 0;
  const endRecord = () => {
    cells.push(field);
    records.push({ row: records.length + 1, cells });
    cells = [];
    field = '';
  };
  while (index < source.length) {
    const char = source[index];
    if (isQuoted) {
      if (char === '"') {
        if (source[index + 1] === '"') {
          field += '"';
          index += 2;
          continue;
        }
        isQuoted = false;
        index += 1;
        continue;
      }
      field += char;
      index += 1;
      continue;
    }
    if (char === '"' && field === '') {
      isQuoted = true;
      quoteStartRow = records.length + 1;
      index += 1;
    } else if (char === delimiter) {
      cells.push(field);
      field = '';
      index += 1;
    } else if (char === '\n' || char === '\r') {
      endRecord();
      index += char === '\r' && source[index + 1] === '\n' ? 2 : 1;
    } else {
      field += char;
      index += 1;
    }
  }
  if (isQuoted) throw new CsvFormatError(quoteStartRow, `A quoted value that starts in row ${quoteStartRow} never ends.`);
  // A file that ends without a line break still has its last record.
  if (field !== '' || cells.length > 0) endRecord();
  return records;
}
