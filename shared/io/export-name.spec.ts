import { chainReferenceOhm, exportFileName, exportStem, ohmTag } from './export-name';

describe('export-name', () => {
  it('should name a budget CSV after the chain and its reference impedance', () => {
    expect(
      exportFileName({
        chainName: 'Two-metre preamp',
        referenceOhm: 50,
        content: 'budget',
        extension: 'csv',
      }),
    ).toBe('two-metre-preamp_50ohm_budget.csv');
  });

  it('should put the mode between the chain name and the reference', () => {
    expect(
      exportFileName({
        chainName: '433.92 MHz transceiver',
        mode: 'Transmit (full power)',
        referenceOhm: 50,
        extension: 's2p',
      }),
    ).toBe('433-92-mhz-transceiver_transmit-full-power_50ohm.s2p');
  });

  it('should leave out the reference when there is none and keep a double extension', () => {
    expect(exportFileName({ chainName: 'Loop', extension: 'chain.json' })).toBe('loop.chain.json');
  });

  it('should keep only safe characters: no folders, quotes, spaces or accents', () => {
    const name = exportFileName({
      chainName: '../Réseau "test"\\ büro/..',
      referenceOhm: 75,
      content: 'flags',
      extension: 'csv',
    });
    expect(name).toBe('reseau-test-buro_75ohm_flags.csv');
    expect(name).toMatch(/^[a-z0-9._-]+$/);
  });

  it('should name a chain with no letters or digits "chain" and cut long names', () => {
    expect(exportStem('— ∿ —')).toBe('chain');
    expect(exportStem('a'.repeat(200))).toHaveLength(80);
  });

  it('should write impedances with the prefix as the decimal point, as resistor codes do', () => {
    // IEC 60062 marks the decimal point with the multiplier letter (4k7 = 4.7 kΩ).
    expect(ohmTag(50)).toBe('50ohm');
    expect(ohmTag(12.5)).toBe('12p5ohm');
    expect(ohmTag(1000)).toBe('1kohm');
    expect(ohmTag(4700)).toBe('4k7ohm');
    expect(ohmTag(2.2e6)).toBe('2meg2ohm');
    expect(ohmTag(0.5)).toBe('500mohm');
  });

  it('should take 50 Ω when the chain sets no reference', () => {
    expect(chainReferenceOhm({})).toBe(50);
    expect(chainReferenceOhm({ referenceOhm: 75 })).toBe(75);
  });
});
