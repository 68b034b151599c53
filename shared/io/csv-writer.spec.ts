import Papa from 'papaparse';
import { csvFromRows, csvNumber, csvText } from './csv-writer';

// RFC 4180 section 2: CRLF line ends (rule 1), a header line (3), fields holding a comma,
// quote or line break enclosed in quotes (6) with inner quotes doubled (7).
describe('csv-writer', () => {
  it('should write a header line and rows with CRLF line ends', () => {
    const text = csvText({ columns: ['Stage', 'Loaded Q'], rows: [['Tank', 42.5]] });
    expect(text).toBe('Stage,Loaded Q\r\nTank,42.5\r\n');
  });

  it('should quote commas, quotes and line breaks and double the inner quotes', () => {
    const text = csvText({
      columns: ['Quantity', 'Note'],
      rows: [
        ['Z looking in, R', 'the "first" try'],
        ['two\nlines', 'plain'],
      ],
    });
    expect(text.split('\r\n')).toEqual([
      'Quantity,Note',
      '"Z looking in, R","the ""first"" try"',
      '"two\nlines",plain',
      '',
    ]);
  });

  it('should keep nine significant figures and write missing values as empty cells', () => {
    expect(csvNumber(0.1 + 0.2)).toBe(0.3);
    expect(csvNumber(1 / 3)).toBe(0.333333333);
    expect(csvNumber(null)).toBe('');
    expect(csvNumber(Number.NaN)).toBe('');
    expect(csvNumber(Number.NEGATIVE_INFINITY)).toBe('-Infinity');
    const text = csvText({ columns: ['a', 'b', 'c'], rows: [[2.5e-12, null, undefined]] });
    expect(text).toBe('a,b,c\r\n2.5e-12,,\r\n');
  });

  it('should pad short rows so every line has as many fields as the headings', () => {
    const text = csvText({ columns: ['a', 'b', 'c'], rows: [['x']] });
    expect(text).toBe('a,b,c\r\nx,,\r\n');
  });

  it('should defuse text a spreadsheet would run as a formula, but not negative numbers', () => {
    const text = csvText({ columns: ['Label', 'Gain'], rows: [['=HYPERLINK("x")', -3.5]] });
    expect(text).toBe('Label,Gain\r\n"\'=HYPERLINK(""x"")",-3.5\r\n');
  });

  it('should put several tables one after another with a blank line between them', () => {
    const text = csvText(
      { columns: ['a'], rows: [[1]] },
      csvFromRows([
        ['Figure', 'Value'],
        ['Tone spacing', '20000'],
      ]),
    );
    expect(text).toBe('a\r\n1\r\n\r\nFigure,Value\r\nTone spacing,20000\r\n');
  });

  it('should read back with a CSV parser to the same cells', () => {
    const rows = [['µ, Ω and "quotes"', 'line\r\nbreak', '1.5']];
    const parsed = Papa.parse<string[]>(csvText({ columns: ['x', 'y', 'z'], rows }), {
      skipEmptyLines: true,
    });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toEqual([['x', 'y', 'z'], ...rows]);
  });
});
