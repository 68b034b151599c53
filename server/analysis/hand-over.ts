/**
 * An analysis thread's answer handed to the event loop without a copy: the answer's bytes
 * (a buffer of their own, see encodeAnswer) are transferred, not cloned, so the event loop
 * does not copy a maximum-size answer (megabytes) while it should be answering others.
 */
import { Piscina, transferableSymbol, valueSymbol } from 'piscina';
import type { AnalysisOutcome } from './analysis-task';

/**
 * `outcome` marked for piscina to transfer its answer's buffer. A view into a larger buffer
 * (Node's pool of small buffers, which cannot be transferred) is left to be cloned.
 */
export function handOver(outcome: AnalysisOutcome): AnalysisOutcome {
  if (outcome.kind !== 'answer') return outcome;
  const { buffer, byteOffset, byteLength } = outcome.body;
  if (!(buffer instanceof ArrayBuffer) || byteOffset !== 0 || byteLength !== buffer.byteLength) {
    return outcome;
  }
  const movable = {
    [transferableSymbol]: [buffer],
    [valueSymbol]: outcome,
  };
  // The pool takes the value out of the wrapper before the event loop sees it.
  return Piscina.move(movable) as unknown as AnalysisOutcome;
}
