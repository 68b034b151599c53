import type { PartDto } from '../../../../shared/schema/api';
import { nominal, nominalEngineering } from '../editor/results/format-quantity';

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
  const value = nominalEngineering(part.value, part.kind === 'inductor' ? 'henry' : 'farad');
  const at = part.qFreqHz === null ? '' : ` at ${nominalEngineering(part.qFreqHz, 'hertz')}`;
  return {
    value,
    q: part.q === null ? '—' : `Q ${nominal(part.q)}${at}`,
    tolerance: part.tolerancePct === null ? '—' : `± ${nominal(part.tolerancePct)} %`,
  };
}
