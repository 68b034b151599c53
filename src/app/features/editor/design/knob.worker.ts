/// <reference lib="webworker" />
/**
 * The engine in a Web Worker, for the value knob: each question is answered by `knobAnswer`
 * (`knob-analysis.ts`). The saved result stays the server's; this answer is only for the live
 * views.
 */
import { knobAnswer } from './knob-analysis';
import type { KnobQuestion } from './knob-messages';

addEventListener('message', ({ data }: MessageEvent<KnobQuestion>) => {
  postMessage(knobAnswer(data));
});
