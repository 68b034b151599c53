import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import * as en from '@zxcvbn-ts/language-en';
import { ValidationError } from '../common/errors';

/** Lowest zxcvbn score accepted (0–4; 3 is "safely unguessable" against online attacks). */
export const MIN_PASSWORD_SCORE = 3;

let factory: ZxcvbnFactory | undefined;
function estimator(): ZxcvbnFactory {
  // The dictionaries are large: build them on the first password checked, not at start.
  factory ??= new ZxcvbnFactory({
    translations: en.translations,
    graphs: common.adjacencyGraphs,
    dictionary: { ...common.dictionary, ...en.dictionary, userInputs: ['chainwright'] },
  });
  return factory;
}

/**
 * Refuses (422 on `field`) a password the zxcvbn estimator finds easy to guess, with its
 * advice. `personal` holds the account's own words (address, name), which do not count.
 */
export function assertStrongPassword(password: string, personal: string[], field: string): void {
  const result = estimator().check(password, personal.filter(Boolean));
  if (result.score >= MIN_PASSWORD_SCORE) return;
  const advice = [result.feedback.warning, ...result.feedback.suggestions].filter(Boolean);
  const message = `this password is too easy to guess${advice.length ? `: ${advice.join(' ')}` : ''}; a few unusual words together make a strong one`;
  throw new ValidationError(message, [{ path: field, message }]);
}
