import { ZxcvbnFactory, type ZxcvbnResult } from '@zxcvbn-ts/core';
import { adjacencyGraphs, dictionary } from '@zxcvbn-ts/language-common';

// The password policy for every new password (one's own change, an administrator's typed one, the user:create script,
// and the one-time passwords the app generates): at least 12 characters, at most 72 bytes of UTF-8 (bcrypt reads no
// more), and not easy to guess — zxcvbn-ts (core 4.2.0, common dictionary 4.1.3) must give it a score of 3 or more
// ("safely unguessable", about 10^8 guesses and up) and it must not be, as a whole, a word of the common-password
// list or one of the person's own details (e-mail, name). The dictionary is large: the client loads this module with a
// dynamic import() so the first page does not grow.

// The length limits are the request schema's (shared/schemas/auth.ts, a leaf the first page may load).
import { NEW_PASSWORD_MIN as PASSWORD_MIN_LENGTH, PASSWORD_MAX_BYTES, utf8Bytes } from '../schemas/auth.js';

export { PASSWORD_MAX_BYTES, PASSWORD_MIN_LENGTH, utf8Bytes };
/** The lowest zxcvbn score accepted (0 too guessable … 4 very unguessable). */
export const PASSWORD_MIN_SCORE = 3;

let factory: ZxcvbnFactory | null = null;
function zxcvbn(): ZxcvbnFactory {
  factory ??= new ZxcvbnFactory({ dictionary: { ...dictionary }, graphs: adjacencyGraphs });
  return factory;
}

/** Characters counted as people read them (an emoji or an accented letter is one). */
const characters = (text: string) => [...text].length;

// zxcvbn's warning keys in words (its own texts come from a translation package this app does not load).
const WARNINGS: Record<string, string> = {
  straightRow: 'a straight row of keys is easy to guess',
  keyPattern: 'a short keyboard pattern is easy to guess',
  simpleRepeat: 'repeated characters are easy to guess',
  extendedRepeat: 'repeated groups of characters are easy to guess',
  sequences: 'a sequence such as abc or 6543 is easy to guess',
  recentYears: 'recent years are easy to guess',
  dates: 'dates are easy to guess',
  topTen: 'this is one of the most common passwords',
  topHundred: 'this is one of the most common passwords',
  common: 'this is one of the most common passwords',
  similarToCommon: 'this is very like a common password',
  wordByItself: 'a single word is easy to guess',
  namesByThemselves: 'a name by itself is easy to guess',
  commonNames: 'common names are easy to guess',
  userInputs: 'it is made of your own name or e-mail address',
  pwned: 'this password has appeared in a data breach',
};

/** True when the whole password is one entry of the common-password list or one of the person's own details. */
function isDictionaryWord(result: ZxcvbnResult): boolean {
  const seq = result.sequence;
  if (seq.length !== 1) return false;
  const only = seq[0]!;
  return only.pattern === 'dictionary' && only.i === 0 && only.j === result.password.length - 1;
}

/**
 * Why a new password is refused, in words for the person choosing it ("this is one of the most common passwords;
 * choose a longer phrase"), or null when it passes. `personal` are the person's e-mail and name, which the password
 * must not simply repeat. Pure: the same answer on the server and as it is typed.
 */
export function passwordPolicyProblem(password: string, personal: readonly string[] = []): string | null {
  if (characters(password) < PASSWORD_MIN_LENGTH) return `at least ${PASSWORD_MIN_LENGTH} characters`;
  if (utf8Bytes(password) > PASSWORD_MAX_BYTES) return `at most ${PASSWORD_MAX_BYTES} bytes (fewer characters with accents or symbols)`;
  // Each detail whole, an e-mail's part before the @, and their words.
  const inputs = personal.flatMap((p) => [p, p.split('@')[0]!, ...p.split(/[\s@.+_-]+/)]).map((p) => p.trim()).filter((p) => p.length >= 3);
  const result = zxcvbn().check(password, inputs);
  if (isDictionaryWord(result)) {
    const own = result.sequence[0]!.dictionaryName === 'userInputs';
    return own ? 'this is your own name or e-mail address; choose a longer phrase' : 'this is one of the most common passwords; choose a longer phrase';
  }
  if (result.score < PASSWORD_MIN_SCORE) {
    const why = WARNINGS[result.feedback.warning ?? ''] ?? 'it is too easy to guess';
    return `${why}; choose a longer phrase of unrelated words`;
  }
  return null;
}
