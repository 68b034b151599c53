/**
 * The benchmark's sections, in the order they run and print. A new section is a module
 * exporting a `BenchSection` (see rows.ts) and one line below.
 */
import { apiSection } from './api';
import { cliSection } from './cli';
import { editorSection } from './editor';
import { engineSection } from './engine';
import { knobSection } from './knob';
import type { BenchSection } from './rows';
import { studiesSection } from './studies';

export const SECTIONS: BenchSection[] = [
  engineSection,
  cliSection,
  editorSection,
  apiSection,
  knobSection,
  studiesSection,
];
