import { TestBed } from '@angular/core/testing';
import { DRAW_WAIT_MS, NEAR_VIEW_PX, OFF_SCREEN_WAIT_MS, PlotDrawQueue } from './plot-draw-queue';

/** An element laid out at `top` (px from the window's top), 380 px high. */
function plotAt(top: number): HTMLElement {
  const element = document.createElement('div');
  element.getBoundingClientRect = () =>
    ({ top, bottom: top + 380, height: 380, left: 0, right: 600, width: 600 }) as DOMRect;
  return element;
}

/** A drawing that finishes when the test says so. */
function gate() {
  let open!: () => void;
  let fail!: (e: Error) => void;
  const done = new Promise<void>((resolve, reject) => {
    open = resolve;
    fail = reject;
  });
  return { done, open, fail };
}

describe('PlotDrawQueue', () => {
  let queue: PlotDrawQueue;
  let idle: { callback: () => void; options?: { timeout: number } }[];
  const view = window as unknown as { requestIdleCallback?: unknown };

  beforeEach(() => {
    jest.useFakeTimers();
    idle = [];
    view.requestIdleCallback = (callback: () => void, options?: { timeout: number }) =>
      idle.push({ callback, options });
    queue = TestBed.inject(PlotDrawQueue);
  });

  afterEach(() => {
    delete view.requestIdleCallback;
    jest.useRealTimers();
  });

  /** Lets a finished drawing settle and a frame pass. */
  async function nextFrame(): Promise<void> {
    await jest.advanceTimersByTimeAsync(50);
  }

  it('should draw the plot in view first, and one below the fold only when idle', async () => {
    const order: string[] = [];
    const below = { element: plotAt(1200), draw: async () => void order.push('below') };
    const shown = { element: plotAt(100), draw: async () => void order.push('shown') };
    queue.schedule('below', below);
    queue.schedule('shown', shown);
    expect(order).toEqual(['shown']);
    await nextFrame();
    expect(order).toEqual(['shown']);
    expect(idle).toHaveLength(1);
    expect(idle[0].options).toEqual({ timeout: OFF_SCREEN_WAIT_MS });
    idle[0].callback();
    expect(order).toEqual(['shown', 'below']);
  });

  it('should start the next drawing only after the one under way has finished and painted', async () => {
    const first = gate();
    const started: string[] = [];
    queue.schedule('a', {
      element: plotAt(0),
      draw: () => (started.push('a'), first.done),
    });
    queue.schedule('b', { element: plotAt(400), draw: async () => void started.push('b') });
    expect(started).toEqual(['a']);
    await nextFrame();
    expect(started).toEqual(['a']);
    first.open();
    await nextFrame();
    expect(started).toEqual(['a', 'b']);
  });

  it('should draw only the latest figure a plot asked for before its turn', async () => {
    const first = gate();
    const drawn: string[] = [];
    queue.schedule('a', { element: plotAt(0), draw: () => first.done });
    queue.schedule('b', { element: plotAt(400), draw: async () => void drawn.push('old') });
    queue.schedule('b', { element: plotAt(400), draw: async () => void drawn.push('new') });
    first.open();
    await nextFrame();
    await nextFrame();
    expect(drawn).toEqual(['new']);
  });

  it('should drop the drawing of a plot that went away, and go on after a failed one', async () => {
    const first = gate();
    const drawn: string[] = [];
    queue.schedule('a', { element: plotAt(0), draw: () => first.done });
    queue.schedule('gone', { element: plotAt(300), draw: async () => void drawn.push('gone') });
    queue.schedule('c', { element: plotAt(500), draw: async () => void drawn.push('c') });
    queue.cancel('gone');
    first.fail(new Error('no layout'));
    await nextFrame();
    expect(drawn).toEqual(['c']);
  });

  it('should not keep a plot in view waiting for the idle moment asked for one below', async () => {
    const drawn: string[] = [];
    queue.schedule('below', { element: plotAt(2000), draw: async () => void drawn.push('below') });
    expect(idle).toHaveLength(1);
    queue.schedule('shown', { element: plotAt(0), draw: async () => void drawn.push('shown') });
    expect(drawn).toEqual(['shown']);
    await nextFrame();
    idle[0].callback();
    expect(drawn).toEqual(['shown', 'below']);
  });

  it('should go on when the plot being drawn goes away, or its drawing never ends', async () => {
    const drawn: string[] = [];
    const never = new Promise<void>(() => undefined);
    queue.schedule('gone', { element: plotAt(0), draw: () => never });
    queue.schedule('b', { element: plotAt(100), draw: () => (drawn.push('b'), never) });
    queue.schedule('c', { element: plotAt(200), draw: async () => void drawn.push('c') });
    queue.cancel('gone');
    await nextFrame();
    expect(drawn).toEqual(['b']);
    await jest.advanceTimersByTimeAsync(DRAW_WAIT_MS);
    expect(drawn).toEqual(['b', 'c']);
  });

  it('should count a plot just below the window as in view', async () => {
    const drawn: string[] = [];
    const near = window.innerHeight + NEAR_VIEW_PX - 50;
    const far = window.innerHeight + NEAR_VIEW_PX + 50;
    queue.schedule('far', { element: plotAt(far), draw: async () => void drawn.push('far') });
    queue.schedule('near', { element: plotAt(near), draw: async () => void drawn.push('near') });
    expect(drawn).toEqual(['near']);
    await nextFrame();
    expect(drawn).toEqual(['near']);
    idle[0].callback();
    expect(drawn).toEqual(['near', 'far']);
  });

  it('should hold the plots out of view while asked, and draw their newest figure after', async () => {
    const drawn: string[] = [];
    const below = (name: string) => ({
      element: plotAt(2000),
      draw: async () => void drawn.push(name),
    });
    queue.schedule('below', below('old'));
    expect(idle).toHaveLength(1);
    queue.holdOffScreen(true);
    // The browser goes idle while the answer is on its way: nothing out of view is drawn.
    idle[0].callback();
    await nextFrame();
    expect(drawn).toEqual([]);
    queue.schedule('below', below('new'));
    expect(idle).toHaveLength(1);
    // A plot in view is drawn all the same.
    queue.schedule('shown', { element: plotAt(0), draw: async () => void drawn.push('shown') });
    expect(drawn).toEqual(['shown']);
    await nextFrame();
    expect(drawn).toEqual(['shown']);
    queue.holdOffScreen(false);
    expect(idle).toHaveLength(2);
    idle[1].callback();
    expect(drawn).toEqual(['shown', 'new']);
  });
});
