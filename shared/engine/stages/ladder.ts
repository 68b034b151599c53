/**
 * Ladder networks of lossy L, C and R: the sections and the SPICE lines from one list of
 * elements, so the two cannot drift apart.
 */
import type { ComplexFn, Section } from '../types';
import {
  capacitorYFn,
  capacitorZFn,
  constantFn,
  inductorYFn,
  inductorZFn,
  seriesSection,
  shuntSection,
  SpiceWriter,
} from './common';

/** One ladder element, from port 1 towards port 2. Q is ignored for R. */
export interface LadderElement {
  part: 'L' | 'C' | 'R';
  place: 'series' | 'shunt';
  value: number;
  q?: number;
}

function impedanceOf(e: LadderElement): ComplexFn {
  const q = e.q ?? Infinity;
  if (e.part === 'L') return inductorZFn(e.value, q);
  if (e.part === 'C') return capacitorZFn(e.value, q);
  return constantFn(e.value);
}

function admittanceOf(e: LadderElement): ComplexFn {
  const q = e.q ?? Infinity;
  if (e.part === 'L') return inductorYFn(e.value, q);
  if (e.part === 'C') return capacitorYFn(e.value, q);
  return constantFn(1 / e.value);
}

/** One section per element, in order. */
export function ladderSections(elements: LadderElement[]): Section[] {
  return elements.map((e) =>
    e.place === 'series' ? seriesSection(impedanceOf(e)) : shuntSection(admittanceOf(e)),
  );
}

/** The element's own admittance (shunt) or impedance (series), for resonator declarations. */
export function elementFn(e: LadderElement): ComplexFn {
  return e.place === 'series' ? impedanceOf(e) : admittanceOf(e);
}

/** ngspice lines for the ladder between inNode and outNode. */
export function ladderSpice(elements: LadderElement[]) {
  return (inNode: string, outNode: string, prefix: string): string[] => {
    const w = new SpiceWriter(prefix);
    let node = inNode;
    elements.forEach((e, i) => {
      const last = i === elements.length - 1;
      const emit = (a: string, b: string) => {
        if (e.part === 'L') w.inductor(a, b, e.value, e.q ?? Infinity);
        else if (e.part === 'C') w.capacitor(a, b, e.value, e.q ?? Infinity);
        else w.resistor(a, b, e.value);
      };
      if (e.place === 'series') {
        const next = last ? outNode : w.node();
        emit(node, next);
        node = next;
      } else {
        emit(node, '0');
        if (last) w.wire(node, outNode);
      }
    });
    return w.lines;
  };
}
