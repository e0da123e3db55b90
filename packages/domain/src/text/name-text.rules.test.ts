import { describe, expect, it } from 'vitest';
import { hasUnsafeNameCharacter, nameSchema } from './name-text.rules';

describe('names refuse control and bidirectional-formatting characters', () => {
  // Code points from the Unicode Standard: C0/C1 controls (ch. 23.1), bidi controls (UAX #9 §2) [STD].
  const refused = ['\u0000', '\r', '\n', '\t', '\u001b', '\u007f', '\u0085', '\u009f', '\u061c', '\u200e', '\u200f', '\u2028', '\u2029', '\u202a', '\u202d', '\u202e', '\u2066', '\u2069'];
  for (const char of refused) {
    it(`refuses U+${char.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`, () => {
      expect(hasUnsafeNameCharacter(`Dana${char}Whitfield`)).toBe(true);
      const parsed = nameSchema(1, 80).safeParse(`Dana${char}Whitfield`);
      expect(parsed.success).toBe(false);
      expect(parsed.error?.issues[0]?.message).toMatch(/control characters/);
    });
  }

  it('keeps letters of every script, accents, emoji joiners and ordinary punctuation', () => {
    for (const name of ['Dana Whitfield', 'Zoë O’Brien-Łukasz', 'محمد الحسن', 'גלעד', '山田 太郎', 'Ridgeline Garage & Co.', '👩‍🔧 Bench']) {
      expect(nameSchema(1, 80).parse(name)).toBe(name);
    }
  });

  it('trims and bounds like before', () => {
    expect(nameSchema(2, 5).parse('  Abc  ')).toBe('Abc');
    expect(nameSchema(2, 5).safeParse('A').success).toBe(false);
    expect(nameSchema(2, 5).safeParse('Abcdef').success).toBe(false);
  });
});
