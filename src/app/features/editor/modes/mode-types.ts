/** The mode types of the chain document, under the names the editor uses. */
export type { Mode as ChainMode, ModeKind } from '../../../../../shared/schema/chain';
export { MODE_KINDS } from '../../../../../shared/schema/chain';

/** What each kind of mode is called in the editor. */
export const MODE_KIND_WORDS = {
  receive: 'Receive',
  transmit: 'Transmit',
  state: 'Switched state',
} as const;
