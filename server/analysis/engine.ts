import type { ChainDocument } from '../../shared/schema/chain';
import type { AnalysisResult, MeasuredNetwork, StageTypeInfo } from '../../shared/engine/types';

/** What the server uses of the analysis engine (`shared/engine/index.ts`). */
export interface EngineApi {
  analyzeChain(
    doc: ChainDocument,
    options: {
      sweep: boolean;
      plan?: boolean | 'full';
      dataFiles?: Readonly<Record<string, MeasuredNetwork>>;
    },
  ): AnalysisResult | Promise<AnalysisResult>;
  catalogue(): StageTypeInfo[];
  ENGINE_VERSION: string;
}

// A non-literal specifier keeps the type checker and the server start independent of the
// engine module's presence: the server runs (and answers 503 on analysis routes) while the
// engine is missing or broken.
const ENGINE_MODULE = '../../shared/engine';

let loaded: Promise<EngineApi | null> | undefined;

/** Loads the engine once; null (with a logged reason) when it cannot be loaded. */
export function loadEngine(): Promise<EngineApi | null> {
  loaded ??= import(ENGINE_MODULE).then(
    (mod: Partial<EngineApi>) => {
      if (typeof mod.analyzeChain !== 'function' || typeof mod.catalogue !== 'function') {
        console.warn(
          '[server] shared/engine lacks analyzeChain/catalogue; analysis is unavailable',
        );
        return null;
      }
      return mod as EngineApi;
    },
    (err: unknown) => {
      console.warn(
        `[server] shared/engine could not be loaded; analysis is unavailable: ${String(err)}`,
      );
      return null;
    },
  );
  return loaded;
}
