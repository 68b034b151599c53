/**
 * The CLI's text for modes: the list of a chain's modes, and what a mode adds to the budget
 * (its name, the chain's cautions, the branches to ground, the transmit analysis).
 */
import type { AnalysisResult } from '../../shared/engine';
import type { Mode } from '../../shared/schema/chain';

const n1 = (x: number) => x.toFixed(1);
const abs = (z: { re: number; im: number }) => Math.hypot(z.re, z.im);

/** One line per mode: id, kind, name (the first is analysed when none is named). */
export function modesText(modes: readonly Mode[]): string {
  if (modes.length === 0) return 'This chain has no modes: it is analysed as written.';
  const w = Math.max(...modes.map((m) => m.id.length));
  return modes
    .map(
      (m, i) =>
        `${m.id.padEnd(w)}  ${m.kind.padEnd(8)}  ${m.name}${i === 0 ? '  (analysed when no --mode is given)' : ''}`,
    ) // prettier-ignore
    .join('\n');
}

/** The mode's own lines, or '' for a chain without modes, traps or transmit analysis. */
export function modeReportText(r: AnalysisResult): string {
  const out: string[] = [];
  if (r.mode) out.push(`Mode: ${r.mode.name} (${r.mode.id}, ${r.mode.kind})`);
  for (const c of r.cautions ?? []) out.push(`Caution: ${c.message}`);
  for (const t of r.traps ?? []) {
    const meant = t.intent === 'high' ? 'block' : 'short';
    out.push(`Branch "${t.label}" (meant to ${meant}): |Z| ${n1(abs(t.zBranch))} Ω against ${n1(abs(t.zShunted))} Ω shunted, ${n1(t.ratio)}× (${t.ok ? 'ok' : 'MISSED'})`); // prettier-ignore
  }
  const tx = r.transmit;
  if (tx) {
    out.push(`Transmit: ${n1(tx.deliveredDbm)} dBm (${(tx.deliveredW * 1e3).toPrecision(3)} mW) into the antenna of ${(tx.availableW * 1e3).toPrecision(3)} mW offered; network loss ${tx.networkLossDb.toFixed(2)} dB; swing at the amplifier ${tx.sourceSwingPeakV.toFixed(2)} V peak`); // prettier-ignore
    for (const h of tx.harmonics)
      out.push(`  harmonic ${h.n}·f0: attenuated ${n1(h.attenuationDb)} dB${h.limitDb === null ? '' : ` (limit ${h.limitDb} dB: ${h.ok ? 'ok' : 'MISSED'})`}`); // prettier-ignore
    const rx = tx.receiverInput;
    if (rx) out.push(`  at the receiver's input: ${n1(rx.dbm)} dBm (isolation ${n1(rx.isolationDb)} dB)${rx.limitDbm === null ? '' : ` (limit ${rx.limitDbm} dBm: ${rx.ok ? 'ok' : 'EXCEEDED'})`}`); // prettier-ignore
    for (const p of tx.parts)
      out.push(`  ${p.label}: ${p.vPeak.toPrecision(3)} V peak, ${p.iRms.toPrecision(3)} A rms${p.ok === null ? '' : p.ok ? ' (within rating)' : ' (BEYOND RATING)'}`); // prettier-ignore
  }
  return out.join('\n');
}
