/**
 * The Touchstone reader's header lines: the option line (Touchstone® File Format
 * Specification Rev 1.1) and the Version 2.x keywords (see `touchstone.ts`).
 */
import { fail, portsFromName, type ParseState } from './touchstone-state';

const UNIT_SCALE: Record<string, number> = { HZ: 1, KHZ: 1e3, MHZ: 1e6, GHZ: 1e9 };
const OPTION_HELP =
  'the option line takes a frequency unit (Hz, kHz, MHz, GHz), a parameter (S, Y, Z), ' +
  'a format (DB, MA, RI) and R followed by the reference resistance, e.g. "# MHz S DB R 50"';

/** Reads a `[Keyword] argument` line. */
export function readKeyword(state: ParseState, line: string): void {
  const m = /^\[([^\]]+)\]\s*(.*)$/.exec(line);
  if (!m) fail(state, `"${line}" opens a keyword but has no closing "]"`);
  const keyword = m[1].trim().toLowerCase().replace(/\s+/g, ' ');
  const arg = m[2].trim();
  if (state.pending.length > 0) {
    fail(state, 'the previous frequency point is incomplete', state.pendingLine);
  }
  switch (keyword) {
    case 'version':
      if (!/^2\.[0-9]+$/.test(arg)) fail(state, `[Version] ${arg} is not read; use 2.0 or 2.1`);
      state.version = arg;
      return;
    case 'number of ports': {
      const n = Number(arg);
      if (n !== 1 && n !== 2) fail(state, `[Number of Ports] ${arg}: only 1 and 2 ports are read`);
      if (state.ports !== undefined && state.ports !== n && portsFromName(state.fileName)) {
        fail(state, `[Number of Ports] ${n} disagrees with the file name; rename the file`);
      }
      state.ports = n;
      return;
    }
    case 'two-port data order':
      state.orderGiven = true;
      if (arg === '21_12') state.order21First = true;
      else if (arg === '12_21') state.order21First = false;
      else fail(state, `[Two-Port Data Order] must be 12_21 or 21_12, not "${arg}"`);
      return;
    case 'number of frequencies': {
      const n = Number(arg);
      if (!Number.isInteger(n) || n < 1)
        fail(state, `[Number of Frequencies] needs a count above 0`);
      state.expectedFrequencies = n;
      return;
    }
    case 'reference':
      return readReference(state, arg);
    case 'matrix format':
      if (arg.toLowerCase() !== 'full') {
        fail(state, `[Matrix Format] ${arg} is not read; write the full matrix`);
      }
      return;
    case 'network data':
      if (state.ports === 2 && !state.orderGiven) {
        fail(
          state,
          'a 2.x two-port file needs [Two-Port Data Order] 12_21 or 21_12 before the data',
        );
      }
      state.section = 'network';
      return;
    case 'noise data':
    case 'number of noise frequencies':
      if (keyword === 'noise data') state.section = 'noise';
      return;
    case 'begin information':
      state.section = 'information';
      return;
    case 'end':
      state.section = 'end';
      return;
    default:
      fail(state, `[${m[1]}] is not a keyword this reader knows (mixed-mode data is not read)`);
  }
}

function readReference(state: ParseState, arg: string): void {
  const values = arg.split(/\s+/).filter(Boolean).map(Number);
  if (values.length === 0 || values.some((v) => !(v > 0))) {
    fail(state, '[Reference] needs positive resistances on the same line');
  }
  if (values.some((v) => v !== values[0])) {
    fail(state, '[Reference] gives ports different resistances; renormalise to one reference');
  }
  state.reference = values[0];
}

/** Reads the option line; only the first one counts. */
export function readOptionLine(state: ParseState, line: string): void {
  // 1.1: "Additional option lines after the first are ignored."
  if (state.optionLineSeen) return;
  if (state.freqs.length > 0) fail(state, 'the option line must come before the data');
  state.optionLineSeen = true;
  const tokens = line.slice(1).trim().split(/\s+/).filter(Boolean);
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i].toUpperCase();
    if (t in UNIT_SCALE) state.freqScale = UNIT_SCALE[t];
    else if (t === 'S' || t === 'Y' || t === 'Z') state.parameter = t;
    else if (t === 'DB' || t === 'MA' || t === 'RI') state.format = t;
    else if (t === 'R') {
      const r = Number(tokens[i + 1]);
      if (!(r > 0)) fail(state, `R must be followed by a resistance above 0 ohm; ${OPTION_HELP}`);
      state.reference = r;
      i++;
      // 1.1 per-port syntax "R 50 50": accept extra equal values, refuse different ones.
      while (i + 1 < tokens.length && isNumber(tokens[i + 1])) {
        if (Number(tokens[i + 1]) !== r) {
          fail(state, 'the option line gives ports different references; use one R');
        }
        i++;
      }
    } else if (t === 'H' || t === 'G') {
      fail(state, `${t}-parameters are not read; export S-parameters instead`);
    } else fail(state, `"${tokens[i]}" is not an option; ${OPTION_HELP}`);
  }
}

function isNumber(token: string): boolean {
  return token.trim() !== '' && Number.isFinite(Number(token));
}
