import { csvText, type CsvTable } from '../../../../shared/io/csv-writer';

/**
 * The first line of every downloaded CSV: what precision its numbers carry. The screen
 * writes figures to the user's chosen significant figures; a file for a spreadsheet keeps
 * the full precision instead, whatever that choice (a "#" line, as pandas' `comment="#"`,
 * gnuplot and most CSV readers skip).
 */
export const CSV_PRECISION_NOTE =
  '# Numbers in SI units (or the unit named in their heading or Unit column) to 9 significant figures, whatever the on-screen number format.';

/** The downloaded file's text: the precision note, then the tables. */
export function csvFileText(tables: CsvTable[] | string): string {
  const text = typeof tables === 'string' ? tables : csvText(...tables);
  return `${CSV_PRECISION_NOTE}\r\n${text}`;
}

/**
 * Hands CSV text to the browser as a download. A byte-order mark tells spreadsheet
 * programs the file is UTF-8 (Ω, µ and − in the labels). Returns the file name.
 */
export function saveCsv(page: Document, fileName: string, tables: CsvTable[] | string): string {
  const view = page.defaultView;
  if (!view) return fileName;
  const url = view.URL.createObjectURL(
    new Blob(['\uFEFF', csvFileText(tables)], { type: 'text/csv;charset=utf-8' }),
  );
  const link = page.createElement('a');
  link.href = url;
  link.download = fileName;
  link.style.display = 'none';
  page.body.appendChild(link);
  link.click();
  link.remove();
  // Revoke after the click has been handled, or some browsers cancel the download.
  view.setTimeout(() => view.URL.revokeObjectURL(url), 0);
  return fileName;
}
