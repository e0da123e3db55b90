import type { z } from 'zod';

/**
 * Plain-language messages for zod's built-in checks, used when a form validates. Messages written into a
 * schema (the domain's password rule, for one) take precedence over this map, so they still show.
 */
export const plainMessage: z.core.$ZodErrorMap = (issue) => {
  switch (issue.code) {
    case 'too_small':
      if (issue.origin === 'string') return Number(issue.minimum) <= 1 ? 'Fill in this field.' : `Use at least ${issue.minimum} characters.`;
      return `Use at least ${issue.minimum}.`;
    case 'too_big':
      return issue.origin === 'string' ? `Use at most ${issue.maximum} characters.` : `Use at most ${issue.maximum}.`;
    case 'invalid_format':
      return issue.format === 'email' ? 'Enter a valid e-mail address.' : 'Check the format of this field.';
    case 'invalid_value':
      return 'Choose one of the options.';
    case 'invalid_type':
      return issue.input === undefined || issue.input === '' ? 'Fill in this field.' : 'Check this field.';
    default:
      return undefined;
  }
};

/** Parse options for `zodResolver(schema, plainErrors)`. */
export const plainErrors = { error: plainMessage };
