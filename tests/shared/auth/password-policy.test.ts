import { describe, expect, it } from 'vitest';
import { PASSWORD_MAX_BYTES, PASSWORD_MIN_LENGTH, passwordPolicyProblem, utf8Bytes } from '../../../shared/auth/password-policy';
import { DEMO_PASSWORD } from '../../../server/db/seed/demo-users';

// The policy: 12 characters or more, 72 bytes of UTF-8 at most (bcrypt's limit: the bcrypt paper, Provos & Mazières
// 1999, and the OpenBSD implementation read at most 72 key bytes), zxcvbn-ts score 3 or more and not a whole dictionary
// word. The judgements of guessability come from zxcvbn-ts 4.2.0 with its common dictionary 4.1.3 (a general-purpose
// library); the byte counts are computed by hand in the comments.

describe('utf8Bytes', () => {
  it('counts bytes as UTF-8 encodes them', () => {
    expect(utf8Bytes('abc')).toBe(3); // ASCII: 1 byte each
    expect(utf8Bytes('é')).toBe(2); // U+00E9: 2 bytes
    expect(utf8Bytes('€')).toBe(3); // U+20AC: 3 bytes
    expect(utf8Bytes('🔌')).toBe(4); // U+1F50C: 4 bytes (a surrogate pair in UTF-16)
  });
});

describe('passwordPolicyProblem', () => {
  it('needs 12 characters, counted as people read them (an emoji is one)', () => {
    expect(PASSWORD_MIN_LENGTH).toBe(12);
    expect(passwordPolicyProblem('Kv9#tq2!Lm4')).toBe('at least 12 characters'); // 11 characters
    // 11 characters but 12 UTF-16 units: still too short.
    expect(passwordPolicyProblem('Kv9#tq2!Lm🔌')).toBe('at least 12 characters');
  });

  it('allows 72 bytes and refuses 73 (bcrypt would cut there)', () => {
    expect(PASSWORD_MAX_BYTES).toBe(72);
    const base = 'Lange Sätze über Bäume, Flüsse und Brücken sind schwer zu erraten'; // 65 characters, 5 of them 2 bytes: 70 bytes
    expect(utf8Bytes(base)).toBe(70);
    expect(passwordPolicyProblem(`${base}12`)).toBeNull(); // 72 bytes
    expect(passwordPolicyProblem(`${base}123`)).toBe('at most 72 bytes (fewer characters with accents or symbols)'); // 73
    expect(passwordPolicyProblem(`${base}1é`)).toMatch(/^at most 72 bytes/); // 70 + 1 + 2 = 73
  });

  it('refuses the common passwords the hardening probe found accepted, in words', () => {
    // Both are 10 characters: the length rule answers first.
    expect(passwordPolicyProblem('1234567890')).toBe('at least 12 characters');
    expect(passwordPolicyProblem('password12')).toBe('at least 12 characters');
    // 12 characters, a whole entry of the common-password list.
    expect(passwordPolicyProblem('123456789012')).toBe('this is one of the most common passwords; choose a longer phrase');
    expect(passwordPolicyProblem('qwertyuiop12')).toMatch(/choose a longer phrase of unrelated words$/);
    expect(passwordPolicyProblem('password1234')).toMatch(/common password; choose a longer phrase of unrelated words$/);
  });

  it('refuses repeats and sequences, and the person’s own e-mail or name', () => {
    expect(passwordPolicyProblem('aaaaaaaaaaaaaaaa')).toBe('repeated characters are easy to guess; choose a longer phrase of unrelated words');
    expect(passwordPolicyProblem('abcdefghijklmnop')).toMatch(/^a sequence/);
    expect(passwordPolicyProblem('morgan.fairweather', ['morgan.fairweather@kestrel-valley.example', 'Morgan Fairweather'])).toMatch(/own name or e-mail/);
    // Without the personal details the same text is judged on its own (two words and a dot: accepted).
    expect(passwordPolicyProblem('morgan.fairweather')).toBeNull();
  });

  it('accepts a phrase of unrelated words and a random one-time password', () => {
    expect(passwordPolicyProblem('seven lanterns over the quiet harbour')).toBeNull();
    expect(passwordPolicyProblem('xK3_9fQ2-LmP0aZw')).toBeNull(); // 16 characters of base64url, as the app generates
  });

  it('judges the seeded demo password (never typed: the demo accounts keep it)', () => {
    // 13 characters, scored 4 by zxcvbn-ts: it passes the policy too.
    expect(passwordPolicyProblem(DEMO_PASSWORD)).toBeNull();
  });
});
