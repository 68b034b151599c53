/**
 * The safety notes a chain carries, in one place for every screen that shows them (the
 * editor, the share page, the printable report): which apply, and their wording.
 */
import type { Caution, StageTypeInfo } from '../../../../../shared/engine/types';

export const CAUTION_WORDING: Record<Caution, string> = {
  transmit:
    'This chain has a transmit path. Transmitting needs a licence for the band and power used, must respect local rules on frequencies, power and spurious emissions, and must not cause harmful interference to other services.',
  'rf-exposure':
    'RF exposure limits apply near transmitting antennas: keep people at the distances your local exposure rules require.',
  'high-voltage':
    'Tube stages run at plate voltages that can kill. Work on them only with the supply off and the capacitors discharged, and follow your local electrical safety rules.',
};

/** The sentence under every list of cautions. */
export const CAUTION_DEFER =
  'Chainwright gives design estimates only. Defer to your local codes and to licensed practice.';

const ORDER: Caution[] = ['transmit', 'rf-exposure', 'high-voltage'];

/**
 * The cautions of a chain, in reading order: those its stage types declare, the transmit
 * caution when it has a transmit mode, and the RF exposure note with any transmit path.
 */
export function cautionsOf(
  types: readonly Pick<StageTypeInfo, 'cautions'>[],
  hasTransmitMode = false,
): Caution[] {
  const found = new Set<Caution>();
  for (const t of types) for (const c of t.cautions ?? []) found.add(c);
  if (hasTransmitMode) found.add('transmit');
  if (found.has('transmit')) found.add('rf-exposure');
  return ORDER.filter((c) => found.has(c));
}
