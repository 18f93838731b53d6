import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import * as en from '@zxcvbn-ts/language-en';

export const PASSWORD_STRENGTH_DEFAULTS = {
  /** zxcvbn's 0–4 scale; 3 is "safely unguessable: moderate protection from offline slow-hash scenario". */
  minScore: 3,
  /** Characters scored; the rest only add strength. Scoring time grows steeply with length (measured here:
   * 64 random characters 0.3–2.4 s with the default l33t table, 40 characters 35–50 ms with 4 substitutions). */
  scoredLength: 48,
  l33tMaxSubstitutions: 4,
};

export const PASSWORD_STRENGTH_SOURCES = {
  minScore: 'zxcvbn (Wheeler, USENIX Security 2016) score 3 = under 10^10 guesses; NIST SP 800-63B §5.1.1.2 asks to refuse common and context-specific passwords',
  scoredLength: 'common practice, no source: bounds the time one sign-up can hold the event loop',
  l33tMaxSubstitutions: '@zxcvbn-ts/core option documentation ("decrease the calcTime significantly")',
};

let factory: ZxcvbnFactory | null = null;
function estimator(): ZxcvbnFactory {
  factory ??= new ZxcvbnFactory({
    translations: en.translations,
    graphs: common.adjacencyGraphs,
    dictionary: { ...common.dictionary, ...en.dictionary },
    maxLength: PASSWORD_STRENGTH_DEFAULTS.scoredLength,
    l33tMaxSubstitutions: PASSWORD_STRENGTH_DEFAULTS.l33tMaxSubstitutions,
  });
  return factory;
}

/**
 * Why a new password is refused, or null when it is fine. The person's e-mail, its local part and their name
 * count as known words (NIST SP 800-63B §5.1.1.2: context-specific words), and the e-mail itself is refused.
 */
export function weakPasswordReason(password: string, person: { email: string; name?: string }): string | null {
  const email = person.email.trim().toLowerCase();
  const local = email.split('@')[0] ?? '';
  if (password.trim().toLowerCase() === email || password.trim().toLowerCase() === local) {
    return 'Password must not be your e-mail address';
  }
  const known = [email, local, ...(person.name ? person.name.toLowerCase().split(/\s+/) : []), 'sowcast'].filter(Boolean);
  const result = estimator().check(password.slice(0, PASSWORD_STRENGTH_DEFAULTS.scoredLength), known);
  if (result.score >= PASSWORD_STRENGTH_DEFAULTS.minScore) return null;
  const hint = result.feedback.warning ?? result.feedback.suggestions[0] ?? 'Add a few unrelated words.';
  return `Password is too easy to guess: ${hint.replace(/\.$/, '')}. A few unrelated words make a strong one.`;
}
