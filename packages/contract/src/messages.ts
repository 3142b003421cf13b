// Validation messages written for the people at the bench and the counter, not for programmers: one zod error
// map, installed when the contract is loaded, so the server's 422 answers and the web forms say the same thing.
import { z } from 'zod';

const things: Record<string, string> = { string: 'text', number: 'a number', boolean: 'yes or no', array: 'a list', object: 'the details', date: 'a date' };

/** A zod issue in plain words; undefined leaves zod's own message (for issues a schema words itself). */
const peopleErrors: z.core.$ZodErrorMap = (iss) => {
  switch (iss.code) {
    case 'invalid_type':
      if (iss.input === undefined || iss.input === null) return 'This is needed.';
      if (iss.expected === 'number' && typeof iss.input === 'number') return 'Enter a finite number, as the meter shows it.';
      return `Enter ${things[iss.expected] ?? iss.expected} here.`;
    case 'too_small': {
      const n = Number(iss.minimum);
      if (iss.origin === 'string') return n <= 1 ? 'This is needed.' : `Write at least ${n} characters.`;
      if (iss.origin === 'array' || iss.origin === 'set') return n <= 1 ? 'Choose at least one.' : `Choose at least ${n}.`;
      return iss.inclusive ? `Enter ${n} or more.` : `Enter more than ${n}.`;
    }
    case 'too_big': {
      const n = Number(iss.maximum);
      if (iss.origin === 'string') return `Keep it to ${n} characters or fewer.`;
      if (iss.origin === 'array' || iss.origin === 'set') return `Choose at most ${n}.`;
      return iss.inclusive ? `Enter ${n} or less.` : `Enter less than ${n}.`;
    }
    case 'invalid_format':
      if (iss.format === 'email') return 'Enter an e-mail address like name@example.com.';
      if (iss.format === 'datetime' || iss.format === 'date') return 'Enter a date (and time).';
      if (iss.format === 'url') return 'Enter a web address starting with https://.';
      return 'This is not in the expected form.';
    case 'invalid_value':
      return `Choose one of: ${iss.values.map(String).join(', ')}.`;
    case 'unrecognized_keys':
      return `Not expected here: ${iss.keys.join(', ')}.`;
    case 'not_multiple_of':
      return `Enter a multiple of ${String(iss.divisor)}.`;
    default:
      return undefined;
  }
};

z.config({ customError: peopleErrors });
