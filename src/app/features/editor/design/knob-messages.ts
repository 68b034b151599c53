import type { ChainDocument } from '../../../../../shared/schema/chain';

/** What the page asks the knob worker. */
export interface KnobQuestion {
  id: number;
  document: ChainDocument;
}

/** What the knob worker answers: the live response at the last node and its key figures. */
export type KnobAnswer =
  | {
      id: number;
      ok: true;
      freqsHz: number[];
      stepUpDb: number[];
      peakHz: number | null;
      bw3dbHz: number | null;
      /** Step-up from the source EMF to the last node at f0, dB. */
      stepUpAtF0Db: number;
      /** Time the worker took, ms. */
      ms: number;
    }
  | { id: number; ok: false; message: string };
