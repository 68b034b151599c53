/**
 * The two ngspice netlists the CLI is compared with: the exported netlist as a user gets it
 * (constant-Q losses as behavioural resistors of `hertz`, exact at every frequency), and
 * the same circuit with every such resistor fixed at its value at f0 (constant resistors:
 * ngspice's AC solver alone, without re-evaluating expressions at each frequency). Both
 * close their control block with `quit 0`, since `ngspice -b` exits with status 1 after a
 * run made only of control commands; and both time themselves (`rusage all`).
 */
import { chainToSpiceDeck } from '../../shared/engine';
import type { ChainDocument } from '../../shared/schema/chain';

export interface BenchDecks {
  exported: string;
  constantR: string;
  dataFile: string;
  /** Columns per data row: f, then re and im of every vector. */
  columns: number;
}

function forBench(netlist: string): string {
  return netlist.replace(/^rusage$/m, 'rusage all').replace(/^\.endc$/m, 'quit 0\n.endc');
}

export function benchDecks(doc: ChainDocument): BenchDecks {
  // Loaded here, when the CLI section needs it, not with the bench: mathjs's full instance
  // (every function and its documentation, some 28 MB of heap) would otherwise sit in the
  // process through the engine section, and every full collection of the analyses timed
  // there would mark it: the analysis threads and the CLI carry nothing like it.
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  const { evaluate } = require('mathjs') as typeof import('mathjs');
  const deck = chainToSpiceDeck(doc);
  const f0 = doc.settings.f0Hz;
  let fixed = 0;
  const constant = deck.netlist.replace(/ r=\{(.+)\}$/gm, (_all, expr: string) => {
    const r = evaluate(expr, { hertz: f0 }) as unknown;
    if (typeof r !== 'number' || !Number.isFinite(r)) {
      throw new Error(`bench: cannot fix the resistor {${expr}} at f0 (got ${String(r)})`);
    }
    fixed += 1;
    return ` ${r}`;
  });
  if (fixed === 0) throw new Error('bench: the netlist has no frequency-dependent resistors');
  return {
    exported: forBench(deck.netlist),
    constantR: forBench(constant),
    dataFile: deck.dataFile,
    columns: 1 + 2 * (deck.nodeVectors.size + 1),
  };
}
