/**
 * The design assistants of the engine (`shared/engine/design`), loaded once. Like the
 * analysis engine, a missing or broken module leaves the server running and these routes
 * answering 503.
 */
import type * as Design from '../../shared/engine/design';

export type DesignApi = typeof Design;

// A non-literal specifier keeps the server start independent of the module's presence.
const DESIGN_MODULE = '../../shared/engine/design';

let loaded: Promise<DesignApi | null> | undefined;

/** Loads the design module once; null (with a logged reason) when it cannot be loaded. */
export function loadDesign(): Promise<DesignApi | null> {
  loaded ??= import(DESIGN_MODULE).then(
    (mod: Partial<DesignApi>) => {
      if (typeof mod.matchHere !== 'function' || typeof mod.tuneResonator !== 'function') {
        console.warn('[server] shared/engine/design lacks its assistants; design is unavailable');
        return null;
      }
      return mod as DesignApi;
    },
    (err: unknown) => {
      console.warn(`[server] shared/engine/design could not be loaded: ${String(err)}`);
      return null;
    },
  );
  return loaded;
}
