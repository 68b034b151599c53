import type { PartDto } from '../../../../shared/schema/api';
import { engineering, nominal, plain } from '../editor/results/format-quantity';

export type PartFieldKey = 'partNumber' | 'kind' | 'value' | 'q' | 'qFreq' | 'tolerance' | 'notes';

/** The fields a parts list's columns map to, in form order, with their labels. */
export const PART_FIELD_LABELS: Record<PartFieldKey, string> = {
  partNumber: 'Part number',
  kind: 'Kind (L or C)',
  value: 'Value',
  q: 'Q',
  qFreq: 'Q measured at',
  tolerance: 'Tolerance (± %)',
  notes: 'Notes',
};

/** A part's figures as the bin and the picker show them, each with its unit. */
export function formatPart(part: Omit<PartDto, 'id'>): {
  value: string;
  q: string;
  tolerance: string;
} {
  const value = engineering(part.value, part.kind === 'inductor' ? 'henry' : 'farad');
  const at = part.qFreqHz === null ? '' : ` at ${engineering(part.qFreqHz, 'hertz')}`;
  return {
    value,
    q: part.q === null ? '—' : `Q ${plain(part.q)}${at}`,
    tolerance: part.tolerancePct === null ? '—' : `± ${nominal(part.tolerancePct)} %`,
  };
}
