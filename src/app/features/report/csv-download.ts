import { csvText, type CsvTable } from '../../../../shared/io/csv-writer';

/**
 * Hands CSV text to the browser as a download. A byte-order mark tells spreadsheet
 * programs the file is UTF-8 (Ω, µ and − in the labels). Returns the file name.
 */
export function saveCsv(page: Document, fileName: string, tables: CsvTable[] | string): string {
  const view = page.defaultView;
  if (!view) return fileName;
  const text = typeof tables === 'string' ? tables : csvText(...tables);
  const url = view.URL.createObjectURL(
    new Blob(['\uFEFF', text], { type: 'text/csv;charset=utf-8' }),
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
