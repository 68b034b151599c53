import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import type { AnalysisOutcome } from './analysis-task';
import { encodeAnswer } from './answer-encoding';
import { handOver } from './hand-over';

type Movable = Record<symbol, unknown>;

describe('an answer handed over from its thread', () => {
  it('should transfer the bytes of an answer of its own, and they arrive whole', async () => {
    const json = JSON.stringify({ values: Array.from({ length: 5000 }, (_, i) => i * 0.5) });
    const outcome: AnalysisOutcome = { kind: 'answer', ...encodeAnswer(json, undefined) };
    const moved = handOver(outcome) as unknown as Movable;
    const transfer = moved[Piscina.transferableSymbol] as ArrayBuffer[];
    expect(transfer).toEqual([outcome.kind === 'answer' && outcome.body.buffer]);
    expect(moved[Piscina.valueSymbol]).toBe(outcome);

    // Posted as piscina posts it: the bytes move, the sender's buffer is left empty.
    const { port1, port2 } = new MessageChannel();
    const received = new Promise<{ body: Uint8Array }>((resolve) => port2.once('message', resolve)); // prettier-ignore
    port1.postMessage(moved[Piscina.valueSymbol], transfer);
    const answer = await received;
    port1.close();
    expect(Buffer.from(answer.body).toString()).toBe(json);
    expect(transfer[0].byteLength).toBe(0);
  });

  it('should leave a view into a shared buffer and every other outcome to be cloned', () => {
    const small: AnalysisOutcome = { kind: 'answer', body: Buffer.from('{"a":1}') };
    expect(Buffer.from('{"a":1}').byteLength).toBeLessThan(Buffer.poolSize);
    expect(handOver(small)).toBe(small);
    const refused: AnalysisOutcome = { kind: 'refused', message: 'no', details: [] };
    expect(handOver(refused)).toBe(refused);
  });
});
