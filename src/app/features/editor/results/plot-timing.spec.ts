import type { PlotlyApi } from './plotly-loader';
import { PLOTTING_READY_MARK, prefetchWhenIdle, warmPlotly } from './plot-timing';
import { fakePlotly } from './testing/fake-plotly';

describe('prefetchWhenIdle', () => {
  const plotly = {} as PlotlyApi;

  it('should load the library from an idle callback, not at once', () => {
    const load = jest.fn(() => Promise.resolve(plotly));
    let idle: (() => void) | undefined;
    const view = {
      requestIdleCallback: jest.fn((cb: () => void) => {
        idle = cb;
        return 1;
      }),
      setTimeout: jest.fn(),
    };
    prefetchWhenIdle(load, view);
    expect(load).not.toHaveBeenCalled();
    expect(view.requestIdleCallback).toHaveBeenCalledWith(expect.any(Function), {
      timeout: 2000,
    });
    idle!();
    expect(load).toHaveBeenCalledTimes(1);
  });

  it('should fall back to a short timer where the browser has no idle callbacks', () => {
    const load = jest.fn(() => Promise.resolve(plotly));
    const view = { setTimeout: jest.fn() };
    prefetchWhenIdle(load, view);
    expect(view.setTimeout).toHaveBeenCalledWith(expect.any(Function), 200);
    view.setTimeout.mock.calls[0][0]();
    expect(load).toHaveBeenCalledTimes(1);
  });

  it('should swallow a failed fetch: the plot reports it when opened', async () => {
    const load = jest.fn(() => Promise.reject(new Error('offline')));
    const view = { setTimeout: (cb: () => void) => cb() };
    expect(() => prefetchWhenIdle(load, view)).not.toThrow();
    await Promise.resolve();
    expect(load).toHaveBeenCalledTimes(1);
  });

  it('should warm the library at the next idle moment after loading it, then mark it ready', async () => {
    const load = jest.fn(() => Promise.resolve(plotly));
    const idle: (() => void)[] = [];
    const view = {
      requestIdleCallback: (cb: () => void) => idle.push(cb),
      setTimeout: jest.fn(),
    };
    const warm = jest.fn(() => Promise.resolve());
    // jsdom has no performance timeline: stand in the mark.
    const timeline = performance as unknown as { mark?: (name: string) => unknown };
    const original = timeline.mark;
    const mark = jest.fn();
    timeline.mark = mark;
    prefetchWhenIdle(load, view, warm);
    idle[0]();
    await Promise.resolve();
    expect(warm).not.toHaveBeenCalled();
    expect(idle).toHaveLength(2);
    idle[1]();
    expect(warm).toHaveBeenCalledWith(plotly);
    await Promise.resolve();
    await Promise.resolve();
    expect(mark).toHaveBeenCalledWith(PLOTTING_READY_MARK);
    timeline.mark = original;
  });
});

describe('warmPlotly', () => {
  it('should draw into a hidden element of the page and remove it afterwards', async () => {
    const fake = fakePlotly();
    const drawn = warmPlotly(fake.api, document);
    const host = fake.reacts[0].element;
    expect(host.isConnected).toBe(true);
    expect(host.getAttribute('aria-hidden')).toBe('true');
    expect(host.style.visibility).toBe('hidden');
    await drawn;
    expect(fake.purged).toEqual([host]);
    expect(host.isConnected).toBe(false);
  });
});
