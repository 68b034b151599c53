import type { PlotlyApi } from './plotly-loader';
import { prefetchWhenIdle } from './plot-timing';

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
});
