import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import * as en from '@zxcvbn-ts/language-en';
import { PASSWORD_MIN_SCORE, passwordTooGuessable } from '@kerfline/domain/users/schema';
import { AppError } from '../errors.js';

/**
 * The strength check behind every place a password is set (own change, reset, invitation accept, an
 * administrator's typed first password). zxcvbn-ts estimates how many guesses a password takes, matching it
 * against the lists its language packs ship (the most common passwords, names, English words, keyboard runs)
 * and the person's own details; below PASSWORD_MIN_SCORE it is refused. The domain's `passwordSchema` keeps
 * the length rule the forms check too; the dictionaries (several MB) stay on the server.
 *
 * The factory takes a few hundred milliseconds to build its dictionaries: built once, on first use.
 */
let factory: ZxcvbnFactory | undefined;

function zxcvbn(): ZxcvbnFactory {
  factory ??= new ZxcvbnFactory({
    dictionary: { ...common.dictionary, ...en.dictionary },
    graphs: common.adjacencyGraphs,
    translations: en.translations,
  });
  return factory;
}

/**
 * Null when the password is acceptable, else the message for the field: what is wrong and what to do.
 * `personal` holds the person's own words (e-mail, name), which make a password easy to guess for them.
 */
export function passwordWeakness(password: string, personal: readonly (string | null | undefined)[]): string | null {
  // Each word of a name or address, and the words run together ("dalepruitt" from "Dale Pruitt").
  const words = personal.flatMap((p) => {
    const parts = (p ?? '')
      .toLowerCase()
      .split('@')[0]!
      .split(/[^\p{L}\p{N}]+/u);
    return [...parts, parts.join('')].filter((w) => w.length >= 3);
  });
  const result = zxcvbn().check(password, [...words, 'kerfline', 'corvane']);
  if (result.score >= PASSWORD_MIN_SCORE) return null;
  return passwordTooGuessable(result.feedback.warning);
}

/** Throws a 400 naming `field` when the password is too easy to guess. */
export function assertPasswordStrong(
  password: string,
  field: string,
  personal: readonly (string | null | undefined)[],
): void {
  const weakness = passwordWeakness(password, personal);
  if (weakness) throw AppError.validation('Choose a harder password', [{ path: field, message: weakness }]);
}
