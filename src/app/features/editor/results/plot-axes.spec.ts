import {
  axisRangeChange,
  linearAxisTicks,
  logAxisTicks,
  retickUpdate,
  ticksForRange,
} from './plot-axes';

describe('log axis ticks', () => {
  it('should tick a wide impedance span by decades with prefixes and the unit', () => {
    const ticks = logAxisTicks([800, 5e3, 2e4, 3.3e5], 'ohm')!;
    expect(ticks.tickmode).toBe('array');
    expect(ticks.ticktext).toEqual(['1 kΩ', '10 kΩ', '100 kΩ']);
    expect(ticks.tickvals).toEqual([1e3, 1e4, 1e5]);
  });

  it('should add 2 and 5 steps when the span is a couple of decades', () => {
    const ticks = logAxisTicks([1.5e6, 40e6], 'hertz')!;
    expect(ticks.ticktext).toEqual(['2 MHz', '5 MHz', '10 MHz', '20 MHz']);
  });

  it('should write small values with sub-unit prefixes', () => {
    const ticks = logAxisTicks([0.8e-6, 2.1e-6], 'henry')!;
    expect(ticks.ticktext).toEqual(['1 µH', '2 µH']);
  });

  it('should skip zero, negative and non-finite values, and give up on none', () => {
    expect(logAxisTicks([0, -5, NaN, Infinity], 'ohm')).toBeNull();
    expect(logAxisTicks([0, 10, 1000], 'ohm')!.ticktext).toEqual([
      '10 Ω',
      '20 Ω',
      '50 Ω',
      '100 Ω',
      '200 Ω',
      '500 Ω',
      '1 kΩ',
    ]);
  });

  it('should label both ends of a span narrower than one step', () => {
    const ticks = logAxisTicks([52, 58], 'ohm')!;
    expect(ticks.ticktext).toEqual(['52 Ω', '58 Ω']);
  });
});

describe('linear axis ticks', () => {
  it('should step a frequency span by 1, 2 or 5 with prefixes and the unit', () => {
    const ticks = linearAxisTicks([9.5e6, 10.5e6], 'hertz')!;
    expect(ticks.tickvals).toEqual([9.6e6, 9.8e6, 10e6, 10.2e6, 10.4e6]);
    expect(ticks.ticktext).toEqual(['9.6 MHz', '9.8 MHz', '10 MHz', '10.2 MHz', '10.4 MHz']);
  });

  it('should write as many figures as the step needs to tell ticks apart', () => {
    const ticks = linearAxisTicks([10.7e6, 10.7012e6], 'hertz')!;
    expect(ticks.ticktext[0]).toBe('10.7 MHz');
    expect(ticks.ticktext[1]).toBe('10.7002 MHz');
  });

  it('should cross zero with signed ticks and an exact zero', () => {
    const ticks = linearAxisTicks([-4200, 3100], 'hertz')!;
    expect(ticks.ticktext).toEqual(['-4 kHz', '-2 kHz', '0 Hz', '2 kHz']);
  });

  it('should give two ticks or more for a single value and none for no values', () => {
    expect(linearAxisTicks([50, 50], 'ohm')!.tickvals.length).toBeGreaterThanOrEqual(2);
    expect(linearAxisTicks([0, 0], 'hertz')!.ticktext).toEqual(['-4 Hz', '-2 Hz', '0 Hz', '2 Hz', '4 Hz']); // prettier-ignore
    expect(linearAxisTicks([null, NaN], 'ohm')).toBeNull();
  });
});

describe('ticks after a zoom or pan', () => {
  it('should read a range given as two keys or as a pair, in either order', () => {
    expect(axisRangeChange({ 'xaxis.range[0]': 5, 'xaxis.range[1]': 9 }, 'xaxis')).toEqual({ range: [5, 9] }); // prettier-ignore
    expect(axisRangeChange({ 'yaxis.range': [7, 6] }, 'yaxis')).toEqual({ range: [6, 7] });
    expect(axisRangeChange({ 'yaxis.range': [7, 6] }, 'xaxis')).toBeNull();
  });

  it('should report a double-click reset and ignore events that set no usable range', () => {
    expect(axisRangeChange({ 'xaxis.autorange': true }, 'xaxis')).toBe('reset');
    expect(axisRangeChange({ 'xaxis.range[0]': 5 }, 'xaxis')).toBeNull();
    expect(axisRangeChange({ 'xaxis.range': [3, 3] }, 'xaxis')).toBeNull();
    expect(axisRangeChange({ 'xaxis.tickvals': [1, 2] }, 'xaxis')).toBeNull();
  });

  it('should tick a log axis from the log10 range Plotly reports', () => {
    const ticks = ticksForRange([6, 7], true, 'hertz')!;
    expect(ticks.ticktext).toEqual(['1 MHz', '2 MHz', '3 MHz', '5 MHz', '7 MHz', '10 MHz']);
    expect(ticks.tickvals[0]).toBe(1e6);
  });

  it('should tick a zoomed linear axis more finely than the whole span', () => {
    const whole = linearAxisTicks([1e6, 30e6], 'hertz')!;
    const zoomed = ticksForRange([10e6, 10.3e6], false, 'hertz')!;
    expect(whole.tickvals).not.toContain(10.05e6);
    expect(zoomed.tickvals).toEqual([10e6, 10.05e6, 10.1e6, 10.15e6, 10.2e6, 10.25e6, 10.3e6]);
    expect(zoomed.ticktext[1]).toBe('10.05 MHz');
  });
});

describe('tick update for a relayout event', () => {
  const base = {
    xaxis: { tickvals: [1e6, 1e7], ticktext: ['1 MHz', '10 MHz'] },
    yaxis: { type: 'log', tickvals: [10, 100], ticktext: ['10 Ω', '100 Ω'] },
  };
  const units = { xaxis: 'hertz', yaxis: 'ohm' } as const;

  it('should re-tick only the axes whose range changed, log axes from log10', () => {
    const update = retickUpdate({ 'yaxis.range[0]': 1, 'yaxis.range[1]': 2 }, units, base)!;
    expect(Object.keys(update)).toEqual(['yaxis.tickvals', 'yaxis.ticktext']);
    expect(update['yaxis.ticktext']).toEqual(['10 Ω', '20 Ω', '30 Ω', '50 Ω', '70 Ω', '100 Ω']);
  });

  it("should bring back the data's ticks on a reset", () => {
    const update = retickUpdate({ 'xaxis.autorange': true, 'yaxis.autorange': true }, units, base);
    expect(update).toEqual({
      'xaxis.tickvals': [1e6, 1e7],
      'xaxis.ticktext': ['1 MHz', '10 MHz'],
      'yaxis.tickvals': [10, 100],
      'yaxis.ticktext': ['10 Ω', '100 Ω'],
    });
  });

  it('should ignore its own tick update and axes with no unit, so there is no loop', () => {
    expect(retickUpdate({ 'xaxis.tickvals': [1], 'xaxis.ticktext': ['1 Hz'] }, units, base)).toBeNull(); // prettier-ignore
    expect(retickUpdate({ 'xaxis.range': [5e6, 6e6] }, { yaxis: 'ohm' }, base)).toBeNull();
  });
});
