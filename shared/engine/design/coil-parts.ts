/**
 * A stage's parts list with the air-core coil winding (coil-winding.ts) beside each
 * inductance, and its CSV export.
 */
import { coilWinding, DEFAULT_COIL_FORM, type CoilForm, type CoilWinding } from './coil-winding';
import type { StageInstance } from '../../schema/chain';
import { componentParams, definitionOf, numberValue, type DesignOptions } from './chain-edit';

export interface PartRow {
  key: string;
  label: string;
  unit: string;
  value: number;
  tolerancePercent: number | null;
  winding: CoilWinding | null;
}

/** The stage's parts (component values), with the winding beside each inductance. */
export function stageParts(
  stage: StageInstance,
  form: CoilForm = DEFAULT_COIL_FORM,
  options: DesignOptions = {},
): PartRow[] {
  const tolerances = (stage.tolerances ?? {}) as Record<string, number>;
  return componentParams(stage, definitionOf(stage, options)).map((p) => {
    const value = numberValue(stage, p);
    return {
      key: p.key,
      label: p.label,
      unit: p.unit,
      value,
      tolerancePercent: tolerances[p.key] ?? null,
      winding: p.unit === 'henry' && value > 0 ? coilWinding(value, form) : null,
    };
  });
}

const UNIT_SYMBOL: Record<string, string> = { henry: 'H', farad: 'F', ohm: 'Ω' };

/** The parts list as CSV (one row a part; turns and winding length for inductors). */
export function stagePartsCsv(stage: StageInstance, rows: PartRow[], form: CoilForm): string {
  const esc = (s: string) => (/[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
  const formText =
    'lengthM' in form
      ? `former ${form.formerDiameterM * 1e3} mm, length ${form.lengthM * 1e3} mm`
      : `former ${form.formerDiameterM * 1e3} mm, wire ${form.wireDiameterM * 1e3} mm at ${form.pitchM * 1e3} mm pitch`;
  const lines = [
    `# ${esc(stage.label || stage.id)} — parts; coil turns by Wheeler's formula (1928), ${formText}`,
    'part,value,unit,tolerance %,turns,winding length mm',
  ];
  for (const r of rows) {
    lines.push(
      [
        esc(r.label),
        r.value.toExponential(3),
        UNIT_SYMBOL[r.unit] ?? r.unit,
        r.tolerancePercent ?? '',
        r.winding ? r.winding.roundedTurns : '',
        r.winding ? (r.winding.lengthM * 1e3).toFixed(1) : '',
      ].join(','),
    );
  }
  return lines.join('\n') + '\n';
}
