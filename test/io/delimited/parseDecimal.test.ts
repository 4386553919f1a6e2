import { describe, expect, it } from 'vitest';
import { parseDecimal } from '../../../shared/io/delimited/parseDecimal';
import { seededRandom } from '../../seededRandom';

// The reference is the JavaScript engine's own Number() conversion (ECMAScript StringToNumber), which is
// correctly rounded; parseDecimal must return the identical double (Object.is, so -0 counts).
describe('parseDecimal equals Number() exactly', () => {
  it('on edge cases', () => {
    const cases = ['0', '-0', '+0', '.5', '-.5', '5.', '1.', '007', '0.1', '0.3', '-1.23456789012345', '123456789012345', '1234567890123456', '12345678901234567890',
      '0.0000000000000000000001', '0.00000000000000000000001', '1e5', '1E-3', ' 1', '1 ', '1,5', '1.5.2', '--1', '+-1', '-', '+', '.', 'NaN', 'Infinity', '-Infinity', '0x10', 'abc', '9007199254740993', '4.35', '2.675'];
    for (const t of cases) expect(Object.is(parseDecimal(t, false), Number(t)), t).toBe(true);
    for (const t of ['1,5', '-0,25', ',5', '1.5', '1,5,2', '3']) expect(Object.is(parseDecimal(t, true), Number(t.replace(',', '.'))), t).toBe(true);
  });

  it('on 200,000 seeded random decimals of 1 to 17 digits', () => {
    const rand = seededRandom(99);
    for (let k = 0; k < 200_000; k++) {
      const nd = 1 + Math.floor(rand() * 17);
      let s = '';
      for (let d = 0; d < nd; d++) s += Math.floor(rand() * 10);
      const dot = Math.floor(rand() * (nd + 1));
      const t = (rand() < 0.3 ? '-' : '') + s.slice(0, dot) + '.' + s.slice(dot);
      expect(Object.is(parseDecimal(t, false), Number(t))).toBe(true);
    }
  });
});
