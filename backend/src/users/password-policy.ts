import { BadRequestException } from '@nestjs/common';
import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import { adjacencyGraphs, dictionary as commonDictionary } from '@zxcvbn-ts/language-common';
import { dictionary as englishDictionary, translations } from '@zxcvbn-ts/language-en';
import { passwordShapeProblem } from '@kilocycle/common/rules';

/**
 * zxcvbn's score runs 0 (too guessable) to 4; 3 means "safely unguessable: moderate protection from an
 * offline slow-hash scenario" (about 10^8 guesses and more), the level the zxcvbn authors suggest for
 * account passwords. Anything below is refused.
 */
export const MIN_PASSWORD_SCORE = 3;

const zxcvbn = new ZxcvbnFactory({
  dictionary: { ...commonDictionary, ...englishDictionary },
  graphs: adjacencyGraphs,
  translations,
  useLevenshteinDistance: true,
});

/** The account's own words: its name, e-mail, the e-mail's parts and the name's words. */
function personalWords(account: { name: string; email: string }): string[] {
  const email = account.email.toLowerCase();
  const [local = '', domain = ''] = email.split('@');
  const words = [account.name, email, local, domain, ...account.name.split(/\s+/), ...local.split(/[._+-]+/), ...domain.split('.')];
  return [...new Set(words.map((word) => word.trim()).filter((word) => word.length >= 3))];
}

/**
 * The one password policy for every password an account gets (create, change, production's first admin):
 * the shape rule from common (length, 72 bytes), then zxcvbn with its common-password and English lists
 * and the account's own name and e-mail. Returns the message naming the problem, or null.
 */
export function passwordProblem(password: string, account: { name: string; email: string }): string | null {
  const shape = passwordShapeProblem(password);
  if (shape) return shape;
  const result = zxcvbn.check(password, personalWords(account));
  if (result.score >= MIN_PASSWORD_SCORE) return null;
  const why = [result.feedback.warning, ...result.feedback.suggestions].filter(Boolean).join(' ');
  return `password is too easy to guess${why ? `: ${why}` : ''}`;
}

/** passwordProblem as a 400 for the API. */
export function assertPasswordAllowed(password: string, account: { name: string; email: string }): void {
  const problem = passwordProblem(password, account);
  if (problem) throw new BadRequestException([problem]);
}
