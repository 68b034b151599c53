/**
 * A built chain's settings: a deep copy of the document's (so later edits of the document do
 * not reach it), or the settings object of the chain it is built like when they are the same.
 */
import { buildChain } from '../../shared/engine/core/build';
import { builtSettings } from '../../shared/engine/core/model-reuse';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import type { ChainSettings } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { benchChain } from '../../scripts/bench/bench-chain';

const doc = () => parseChainDocument(benchChain(201));

describe('built settings', () => {
  it('are a deep copy equal to the document’s, untouched by later edits of it', () => {
    const d = doc();
    const built = buildChain(d, STAGE_DEFINITIONS);
    expect(built.settings).toEqual(d.settings);
    expect(built.settings).not.toBe(d.settings);
    expect(built.settings.sweep).not.toBe(d.settings.sweep);
    expect(built.settings.offsetsHz).not.toBe(d.settings.offsetsHz);
    d.settings.sweep.stopHz = 1e9;
    d.settings.offsetsHz.push(5);
    expect(built.settings.sweep.stopHz).toBe(9e6);
    expect(built.settings.offsetsHz).toEqual([10e3, 100e3]);
  });

  it('are the settings object of the chain built like it when they are the same', () => {
    const nominal = buildChain(doc(), STAGE_DEFINITIONS);
    const same = buildChain(doc(), STAGE_DEFINITIONS, { like: nominal });
    expect(same.settings).toBe(nominal.settings);
    const moved = doc();
    moved.settings.f0Hz = 7.1e6;
    const other = buildChain(moved, STAGE_DEFINITIONS, { like: nominal });
    expect(other.settings).not.toBe(nominal.settings);
    expect(other.settings.f0Hz).toBe(7.1e6);
    // The nominal's own settings are unchanged by the comparison.
    expect(nominal.settings.f0Hz).toBe(7e6);
  });

  it('copy values that are not plain data as structuredClone does', () => {
    const stamp = new Date(0);
    const settings = {
      ...doc().settings,
      stamp,
      nested: { list: [1, { x: -0 }], none: undefined },
    };
    const copy = builtSettings(settings as unknown as ChainSettings) as unknown as typeof settings;
    expect(copy).toEqual(structuredClone(settings));
    // (A Date of the host's realm: the test runs in a VM context of its own.)
    expect(Object.prototype.toString.call(copy.stamp)).toBe('[object Date]');
    expect(copy.stamp.getTime()).toBe(0);
    expect(copy.stamp).not.toBe(stamp);
    expect(Object.is(copy.nested.list[1] && (copy.nested.list[1] as { x: number }).x, -0)).toBe(
      true,
    );
    expect('none' in copy.nested).toBe(true);
  });
});
