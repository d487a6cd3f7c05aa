import { z } from 'zod';

// The words for a refusal a schema gives no message of its own for. Zod's English locale speaks to
// programmers ("Invalid input: expected number, received NaN"); these speak to makers, and stay the
// lowest priority, so a field's own message (which names the field) always wins. Every schema file
// imports this module, so the words are in place wherever a schema is used, in the browser or on the server.

const counted = (n: number | bigint, one: string, many: string) => `${n} ${Number(n) === 1 ? one : many}`;

function bound(issue: { origin?: string; inclusive?: boolean }, n: number | bigint, side: 'least' | 'most'): string {
  const strict = issue.inclusive === false;
  switch (issue.origin) {
    case 'string':
      return `Use at ${side} ${counted(n, 'character', 'characters')}`;
    case 'array':
    case 'set':
      return side === 'least' ? `Choose at least ${counted(n, 'item', 'items')}` : `Choose at most ${counted(n, 'item', 'items')}`;
    case 'file':
      return side === 'least' ? 'That file is empty' : `That file is larger than ${n} bytes`;
    case 'date':
      return side === 'least' ? 'That date is too early' : 'That date is too late';
    default:
      if (strict) return side === 'least' ? `Give a number above ${n}` : `Give a number below ${n}`;
      return side === 'least' ? `Give a number of at least ${n}` : `Give a number of at most ${n}`;
  }
}

const TYPE_WORDS: Record<string, string> = {
  number: 'Give a number',
  int: 'Give a whole number',
  bigint: 'Give a whole number',
  string: 'Give some text',
  boolean: 'Choose yes or no',
  array: 'Give a list',
  object: 'Fill in this part',
  date: 'Give a date',
  file: 'Choose a file',
};

const makerWords: z.core.$ZodErrorMap = (issue) => {
  switch (issue.code) {
    case 'invalid_type':
      if (issue.input === undefined || issue.input === null) return 'This is needed';
      return TYPE_WORDS[issue.expected] ?? 'That is not something this field takes';
    case 'too_small':
      return bound(issue, issue.minimum, 'least');
    case 'too_big':
      return bound(issue, issue.maximum, 'most');
    case 'invalid_value':
      return 'Choose one of the offered options';
    case 'invalid_format':
      return issue.format === 'email' ? 'Give an e-mail address like name@example.com' : 'That is not in the form this field takes';
    case 'not_multiple_of':
      return `Give a multiple of ${issue.divisor}`;
    case 'unrecognized_keys':
      return `Not a field here: ${issue.keys.join(', ')}`;
    case 'invalid_union':
    case 'invalid_key':
    case 'invalid_element':
    case 'custom':
    default:
      return 'That is not something this field takes';
  }
};

z.config({ localeError: makerWords });
