/**
 * File names for everything the product exports: the chain's name, then the mode when the
 * chain has modes, then the reference impedance the figures are given against, then what
 * the file holds, e.g. `two-metre-preamp_50ohm_budget.csv` or
 * `two-metre-preamp_receive_50ohm.s2p`. Only lower-case ASCII letters, digits, dashes,
 * underscores and the extension's dots, so the name survives every file system, a
 * `Content-Disposition` header without escaping, and a shell.
 */

/** Longest chain-name part of a file name, in characters. */
const MAX_STEM = 80;

/** The reference impedance when the chain names none: Touchstone's own default, 50 Ω. */
export const DEFAULT_REFERENCE_OHM = 50;

/** Lower-case letters, digits and single dashes; '' when nothing is left. */
export function slugPart(text: string, max = MAX_STEM): string {
  return text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .toLowerCase()
    .slice(0, max)
    .replace(/-+$/, '');
}

/** The chain-name stem of every export's file name ('chain' when the name has no letters). */
export function exportStem(chainName: string): string {
  return slugPart(chainName) || 'chain';
}

/**
 * An impedance as a file-name tag with an engineering prefix and the prefix as the
 * decimal point (as resistor codes write 4k7): 50 → `50ohm`, 12.5 → `12p5ohm`,
 * 1000 → `1kohm`, 4700 → `4k7ohm`, 1e6 → `1megohm`.
 */
export function ohmTag(ohm: number): string {
  if (!Number.isFinite(ohm) || ohm <= 0) return 'ohm';
  const steps: [number, string][] = [
    [1e6, 'meg'],
    [1e3, 'k'],
    [1, 'p'],
    [1e-3, 'm'],
  ];
  const [scale, mark] = steps.find(([s]) => ohm >= s) ?? steps[steps.length - 1];
  const scaled = Number((ohm / scale).toPrecision(4));
  const [whole, fraction] = String(scaled).split('.');
  if (mark === 'p') return `${whole}${fraction ? `p${fraction}` : ''}ohm`;
  return `${whole}${mark}${fraction ?? ''}ohm`;
}

export interface ExportNameParts {
  chainName: string;
  /** Reference impedance, Ω; left out of the name when absent (a chain file has none). */
  referenceOhm?: number;
  /** The analysed mode's name, when the chain has modes. */
  mode?: string | null;
  /** What the file holds: 'budget', 'resonators', 'flags', 'plan', 'report'… */
  content?: string;
  /** Without the leading dot: 'csv', 's2p', 'chain.json'. */
  extension: string;
}

/** The sanitised file name of one export. */
export function exportFileName(parts: ExportNameParts): string {
  const pieces = [exportStem(parts.chainName)];
  const mode = parts.mode ? slugPart(parts.mode, 40) : '';
  if (mode) pieces.push(mode);
  if (parts.referenceOhm !== undefined) pieces.push(ohmTag(parts.referenceOhm));
  const content = parts.content ? slugPart(parts.content, 40) : '';
  if (content) pieces.push(content);
  const extension = parts.extension.replace(/[^A-Za-z0-9.]+/g, '').replace(/^\.+/, '');
  return `${pieces.join('_')}.${extension || 'txt'}`;
}

/** The reference impedance a chain's exported figures are given against, Ω. */
export function chainReferenceOhm(settings: { referenceOhm?: number }): number {
  return settings.referenceOhm ?? DEFAULT_REFERENCE_OHM;
}
