import { parseCsv, sniffDelimiter } from './csv-records';

// RFC 4180 (Common Format and MIME Type for CSV Files) is the reference for quoting rules.
describe('parseCsv', () => {
  it('splits plain records and drops the byte-order mark and the final line break', () => {
    expect(parseCsv('\uFEFFa,b\r\n1,2\r\n')).toEqual([
      { row: 1, cells: ['a', 'b'] },
      { row: 2, cells: ['1', '2'] },
    ]);
  });

  it('keeps delimiters, doubled quotes and line breaks inside quotes (RFC 4180 §2.5–2.7), numbering records as a spreadsheet does', () => {
    expect(parseCsv('a,b\n"x, y","say ""hi"""\n"two\nlines",z')).toEqual([
      { row: 1, cells: ['a', 'b'] },
      { row: 2, cells: ['x, y', 'say "hi"'] },
      { row: 3, cells: ['two\nlines', 'z'] },
    ]);
  });

  it('keeps empty cells and blank lines as records', () => {
    expect(parseCsv('a,b\n,\n\n1,')).toEqual([
      { row: 1, cells: ['a', 'b'] },
      { row: 2, cells: ['', ''] },
      { row: 3, cells: [''] },
      { row: 4, cells: ['1', ''] },
    ]);
  });

  it('reads semicolon files (comma-decimal locales) and refuses an unclosed quote with its row', () => {
    expect(sniffDelimiter('a;b\n1;2')).toBe(';');
    expect(parseCsv('a;b\n1;2')[1].cells).toEqual(['1', '2']);
    expect(() => parseCsv('a,b\n1,"open')).toThrow(/starts in row 2/);
  });
});
