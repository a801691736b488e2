// fast-check generators shared by the code tests.
import fc from 'fast-check';

const hexChars = '0123456789ABCDEF'.split('');

export const hexDigit = fc.constantFrom(...hexChars);

/** Any syntactically valid five-character code, upper case. */
export const validCode = fc
  .tuple(fc.constantFrom('P', 'C', 'B', 'U'), fc.integer({ min: 0, max: 3 }), hexDigit, hexDigit, hexDigit)
  .map(([l, d, a, b, c]) => `${l}${d}${a}${b}${c}`);

/** Two hex digits. */
export const validFtb = fc.tuple(hexDigit, hexDigit).map(([a, b]) => a + b);
