// One look for a booking's status in both apps, readable: every text/background pair reaches the
// WCAG 2.1 AA contrast of 4.5:1 (relative luminance and contrast ratio as defined in WCAG 2.1,
// "contrast ratio" and "relative luminance" in its glossary), and every status has an icon.
import { describe, expect, it } from 'vitest';
import { BOOKING_STATUSES } from '@emberline/domain';
import { STATUS_LOOKS } from '../../../packages/ui/src/booking-status';

function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
}
const contrast = (a: string, b: string) => {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
};

describe('booking status looks', () => {
  it('the contrast formula gives 21:1 for black on white and 4.54:1 for #767676 on white (WCAG 2.1 worked values)', () => {
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 5);
    expect(contrast('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
  });

  it.each([...BOOKING_STATUSES])('%s has words, an icon and text at AA contrast on its background', (status) => {
    const look = STATUS_LOOKS[status];
    expect(look, status).toBeDefined();
    expect(look.icon).toBeTruthy();
    expect(contrast(look.color, look.background)).toBeGreaterThanOrEqual(4.5);
  });
});
