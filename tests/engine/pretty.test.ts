import { describe, expect, it } from 'vitest';
import { prettyLength, prettySigned, prettyTolerance } from '#shared/camber/pretty';

describe('report lengths (vulgar fractions, inch sign, true minus)', () => {
  it.each([
    [34.925, '1⅜″'], [12.7, '½″'], [25.4, '1″'], [0, '0″'], [-3.175, '−⅛″'], [33.3375, '1 5⁄16″'], [-28.575, '−1⅛″'], [1.5875, '1⁄16″'],
  ])('%s mm → %s', (mm, text) => expect(prettyLength(mm, 'in')).toBe(text));
  it('signs and tolerances', () => {
    expect(prettySigned(3.175, 'in')).toBe('+⅛″');
    expect(prettySigned(-3.175, 'in')).toBe('−⅛″');
    expect(prettyTolerance(19.05, 'in')).toBe('± ¾″');
    expect(prettyLength(-35.4, 'mm')).toBe('−35 mm');
  });
});
