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
      state.expectedFrequenciesLine = state.lineNo;
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
    case 'number of noise frequencies': {
      const n = Number(arg);
      if (!Number.isInteger(n) || n < 1) {
        fail(state, '[Number of Noise Frequencies] needs a count above 0');
      }
      state.expectedNoiseFrequencies = n;
      state.expectedNoiseFrequenciesLine = state.lineNo;
      return;
    }
    case 'noise data':
      if (state.ports !== 2) fail(state, '[Noise Data] belongs to two-port files only');
      state.section = 'noise';
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

/**
 * `[Reference]`: one resistance per port, on the keyword's line or on the lines after it
 * (2.0: the values "may span multiple lines"). It must follow `[Number of Ports]`.
 */
function readReference(state: ParseState, arg: string): void {
  if (state.ports === undefined) {
    fail(state, '[Reference] must come after [Number of Ports]; move it below that keyword');
  }
  state.portReferences = [];
  state.referenceLine = state.lineNo;
  addReferenceValues(state, arg);
}

/** Adds `[Reference]` values from `text`; ends the keyword once every port has one. */
export function addReferenceValues(state: ParseState, text: string): void {
  const tokens = text.split(/\s+/).filter(Boolean);
  for (const t of tokens) {
    const v = Number(t);
    if (!(v > 0) || !Number.isFinite(v)) {
      fail(state, `[Reference] value "${t}" is not a resistance above 0 ohm`);
    }
    state.portReferences.push(v);
  }
  const ports = state.ports ?? 1;
  if (state.portReferences.length > ports) {
    fail(
      state,
      `[Reference] gives ${state.portReferences.length} values for ${ports} port(s); give one per port`,
    );
  }
  if (state.portReferences.length === ports) {
    state.referenceLine = 0;
    settleReferences(state);
  }
}

/** One reference for every port when they agree; otherwise keep the per-port list. */
export function settleReferences(state: ParseState): void {
  const refs = state.portReferences;
  if (refs.length === 0) return;
  state.reference = refs[0];
  if (refs.every((r) => r === refs[0])) state.portReferences = [];
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
      if (!(r > 0) || !Number.isFinite(r)) {
        fail(state, `R must be followed by a resistance above 0 ohm; ${OPTION_HELP}`);
      }
      state.reference = r;
      i++;
      // Per-port syntax "R 50 75" (Version 1.1 of the 2.1 specification): one per port.
      const refs = [r];
      while (i + 1 < tokens.length && isNumber(tokens[i + 1])) {
        const next = Number(tokens[i + 1]);
        if (!(next > 0) || !Number.isFinite(next)) {
          fail(state, `R values must be finite and above 0 ohm, not ${tokens[i + 1]}`);
        }
        refs.push(next);
        i++;
      }
      if (refs.length > 1 && state.portReferences.length === 0) {
        state.portReferences = refs;
        settleReferences(state);
      }
    } else if (t === 'H' || t === 'G') {
      fail(state, `${t}-parameters are not read; export S-parameters instead`);
    } else fail(state, `"${tokens[i]}" is not an option; ${OPTION_HELP}`);
  }
}

function isNumber(token: string): boolean {
  return token.trim() !== '' && Number.isFinite(Number(token));
}
