/**
 * Reads what a person types into a value field — "22 uH", "2.2k", "4p7", "-95 dBm",
 * "1/(2*pi*1 MHz*50)" — into the SI number the chain document stores.
 *
 * Pure: mathjs is used only to evaluate the arithmetic-and-units expressions, inside a
 * whitelist (numbers, units, + - * / ^, parentheses, a few functions), so typed text can
 * never reach assignment, imports or other mathjs machinery.
 */
import {
  absDependencies,
  addDependencies,
  cosDependencies,
  create,
  divideDependencies,
  eDependencies,
  expDependencies,
  isUnit,
  log10Dependencies,
  logDependencies,
  multiplyDependencies,
  parseDependencies,
  piDependencies,
  powDependencies,
  sinDependencies,
  sqrtDependencies,
  subtractDependencies,
  tanDependencies,
  tauDependencies,
  unaryMinusDependencies,
  unaryPlusDependencies,
  unitDependencies,
  type MathNode,
  type Unit,
} from 'mathjs';
import type { UnitKind } from '../engine/types';
import { KNOWN_DIMENSIONS, UNIT_KINDS } from './kinds';

export type ParseResult = { ok: true; value: number } | { ok: false; message: string };

// Only what arithmetic on quantities needs: the whole library would triple the editor's size.
const math = create({
  parseDependencies,
  unitDependencies,
  addDependencies,
  subtractDependencies,
  multiplyDependencies,
  divideDependencies,
  powDependencies,
  unaryMinusDependencies,
  unaryPlusDependencies,
  sqrtDependencies,
  expDependencies,
  logDependencies,
  log10Dependencies,
  absDependencies,
  sinDependencies,
  cosDependencies,
  tanDependencies,
  piDependencies,
  eDependencies,
  tauDependencies,
});
const MAX_LENGTH = 200;
const NUM = String.raw`[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?`;
const PREFIXES: Record<string, number> = {
  f: 1e-15,
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  m: 1e-3,
  k: 1e3,
  K: 1e3,
  M: 1e6,
  G: 1e9,
  T: 1e12,
};
const FUNCTIONS = new Set(['sqrt', 'exp', 'log', 'log10', 'abs', 'pow', 'sin', 'cos', 'tan']);
const CONSTANTS = new Set(['pi', 'e', 'tau']);
const fail = (message: string): ParseResult => ({ ok: false, message });
const ok = (value: number): ParseResult =>
  Number.isFinite(value) ? { ok: true, value } : fail('the value is not a finite number');

/**
 * Parses `text` as a quantity of `kind`. Returns the SI value (dB, dBm and percent kinds
 * return the number in those units), or a message saying plainly what to fix.
 */
export function parseQuantity(text: string, kind: UnitKind): ParseResult {
  const info = UNIT_KINDS[kind];
  const raw = text.trim();
  if (raw === '') return fail(`enter ${info.noun}, e.g. ${info.example}`);
  if (raw.length > MAX_LENGTH) return fail(`keep it under ${MAX_LENGTH} characters`);
  if (/\d,\d/.test(raw)) return fail('use a point for decimals (4.7, not 4,7)');
  const s = normalise(raw, kind);
  return (
    readLogarithmic(s, kind) ??
    readPercent(s, kind) ??
    readCodedValue(s, kind) ??
    readPrefixOnly(s, kind) ??
    readExpression(s, kind, raw)
  );
}

/** Unicode symbols to the ASCII spellings mathjs knows. */
function normalise(s: string, kind: UnitKind): string {
  let out = s
    .replace(/[µμ]/g, 'u')
    .replace(/[ΩΩ]/g, 'ohm')
    .replace(/°/g, ' deg')
    .replace(/[−–]/g, '-')
    .replace(/[×·]/g, '*');
  // "khz" / "mhz" / "ghz": nobody means millihertz in a receiver, so read the intent.
  if (kind === 'hertz')
    out = out.replace(
      /([kmg])hz\b/gi,
      (_, p: string) => `${p === 'k' || p === 'K' ? 'k' : p.toUpperCase()}Hz`,
    );
  return out;
}

/** dB, dBm (or a power in W), dBuV and dBuV/m. */
function readLogarithmic(s: string, kind: UnitKind): ParseResult | null {
  const m = new RegExp(`^(${NUM})\\s*(dBm|dBuV/m|dBuV|dB)$`, 'i').exec(s);
  if (!m) return null;
  const x = Number(m[1]);
  const suffix = m[2].toLowerCase();
  if (suffix === 'dbm' && kind === 'dbm') return ok(x);
  if (suffix === 'dbm' && kind === 'watt') return ok(1e-3 * 10 ** (x / 10));
  if (suffix === 'db' && (kind === 'db' || kind === 'ratio' || kind === 'none')) {
    return kind === 'db' ? ok(x) : ok(10 ** (x / 20));
  }
  if (suffix === 'dbuv' && kind === 'volt') return ok(1e-6 * 10 ** (x / 20));
  if (suffix === 'dbuv/m' && kind === 'volt-per-metre') return ok(1e-6 * 10 ** (x / 20));
  return fail(`expected ${UNIT_KINDS[kind].noun}, got a value in ${m[2]}`);
}

function readPercent(s: string, kind: UnitKind): ParseResult | null {
  const m = new RegExp(`^(${NUM})\\s*%$`).exec(s);
  if (!m) return null;
  const x = Number(m[1]);
  if (kind === 'percent') return ok(x);
  if (kind === 'ratio' || kind === 'none') return ok(x / 100);
  return fail(`expected ${UNIT_KINDS[kind].noun}, got a percentage`);
}

/** Component codes: 4p7 = 4.7 p, 2k2 = 2.2 k, 4R7 = 4.7 (the letter marks the point). */
function readCodedValue(s: string, kind: UnitKind): ParseResult | null {
  const m = /^([+-]?)(\d+)([fpnumkKMGTR])(\d+)\s*([A-Za-z/]*)$/.exec(s);
  if (!m) return null;
  const [, sign, whole, letter, frac, unit] = m;
  if (unit && !unitMatchesKind(unit, kind)) return null;
  const scale = letter === 'R' ? 1 : PREFIXES[letter];
  return ok(Number(`${sign}${whole}.${frac}`) * scale);
}

/** "2.2k", "22u", "100n": a number with only a prefix, in the kind's own unit. */
function readPrefixOnly(s: string, kind: UnitKind): ParseResult | null {
  const m = new RegExp(`^(${NUM})\\s*([fpnumkKMGT])$`).exec(s);
  if (!m) return null;
  // "2 m" is two metres and "290 K" is a temperature, not milli or kilo.
  if ((kind === 'metre' && m[2] === 'm') || (kind === 'kelvin' && m[2] === 'K')) return null;
  if (!UNIT_KINDS[kind].si && kind !== 'ratio' && kind !== 'none') {
    return fail(`${UNIT_KINDS[kind].noun} takes no prefix: type e.g. ${UNIT_KINDS[kind].example}`);
  }
  return ok(Number(m[1]) * PREFIXES[m[2]]);
}

function unitMatchesKind(unit: string, kind: UnitKind): boolean {
  const si = UNIT_KINDS[kind].si;
  if (!si) return false;
  try {
    return math.unit(unit).equalBase(math.unit(si));
  } catch {
    return false;
  }
}

function readExpression(s: string, kind: UnitKind, raw: string): ParseResult {
  let node: MathNode;
  try {
    node = math.parse(s);
  } catch {
    return fail(
      `could not read "${raw}": type a number with an optional unit, e.g. ${UNIT_KINDS[kind].example}`,
    );
  }
  const refusal = refuseUnsafe(node);
  if (refusal) return fail(refusal);
  let result: unknown;
  try {
    result = node.compile().evaluate({});
  } catch (e) {
    return fail(`could not work out "${raw}": ${(e as Error).message}`);
  }
  if (typeof result === 'number') return ok(result);
  if (isUnit(result)) return fromUnit(result as Unit, kind);
  return fail(`"${raw}" is not a single number`);
}

/** Only arithmetic, known units, a few constants and whitelisted functions may run. */
function refuseUnsafe(root: MathNode): string | null {
  let refusal: string | null = null;
  root.traverse((node, _path, parent) => {
    if (refusal) return;
    switch (node.type) {
      case 'ConstantNode':
      case 'OperatorNode':
      case 'ParenthesisNode':
        return;
      case 'FunctionNode': {
        const name = (node as unknown as { fn: { name?: string } }).fn.name ?? '';
        if (!FUNCTIONS.has(name)) refusal = `the function "${name}" is not available here`;
        return;
      }
      case 'SymbolNode': {
        const name = (node as unknown as { name: string }).name;
        const isCallee = parent?.type === 'FunctionNode';
        if (isCallee || CONSTANTS.has(name) || math.Unit.isValuelessUnit(name)) return;
        refusal = `"${name}" is not a unit I know (units are case-sensitive: uH, pF, kHz, MHz, kohm)`;
        return;
      }
      default:
        refusal = 'only numbers, units and arithmetic (+ - * / ^ and parentheses) are allowed';
    }
  });
  return refusal;
}

function fromUnit(u: Unit, kind: UnitKind): ParseResult {
  const info = UNIT_KINDS[kind];
  if (kind === 'dbm' && u.equalBase(math.unit('W'))) {
    return ok(10 * Math.log10(u.toNumber('W') / 1e-3));
  }
  if (!info.si) return fail(`expected ${info.noun}, got ${describe(u)}`);
  if (u.equalBase(math.unit(info.si))) return ok(u.toNumber(info.si));
  // A time where L or C is wanted is a reactance formula with the resistance left bare:
  // L = X/ω and C = 1/(ωX) with X in ohms, e.g. 1/(2*pi*1 MHz*50).
  if ((kind === 'henry' || kind === 'farad') && u.equalBase(math.unit('s'))) {
    return ok(u.toNumber('s'));
  }
  return fail(`expected ${info.noun}, got ${describe(u)}`);
}

function describe(u: Unit): string {
  const known = KNOWN_DIMENSIONS.find((d) => u.equalBase(math.unit(d.unit)));
  return known ? known.noun : `a quantity in ${u.formatUnits()}`;
}
