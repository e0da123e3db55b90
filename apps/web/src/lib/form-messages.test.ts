import { describe, expect, it } from 'vitest';
import { signUpSchema } from '@revloop/domain/auth';
import { plainErrors } from './form-messages';

const messages = (input: unknown) => {
  const result = signUpSchema.safeParse(input, plainErrors);
  return result.success ? {} : Object.fromEntries(result.error.issues.map((issue) => [issue.path.join('.'), issue.message]));
};

// Precedence (schema message over per-parse map over global config) is zod 4's documented error
// customisation order, zod.dev/error-customization [3P].
describe('plainMessage', () => {
  it('replaces built-in messages and keeps the ones a schema sets', () => {
    expect(messages({ shopName: 'A', name: '', email: 'nope', password: 'short' })).toEqual({
      shopName: 'Use at least 2 characters.',
      name: 'Fill in this field.',
      email: 'Enter a valid e-mail address.',
      password: 'Use at least 10 characters.',
    });
  });

  it('asks for missing fields plainly', () => {
    expect(messages({}).shopName).toBe('Fill in this field.');
  });
});
