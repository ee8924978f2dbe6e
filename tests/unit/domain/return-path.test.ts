// The return address an app carries through sign-in, sign-up and the confirmation link: only a
// path inside the same site passes (WHATWG URL: "//host" and "/\host" both name another host).
import { describe, expect, it } from 'vitest';
import { isSafeReturnPath, RETURN_PATH_MAX } from '@emberline/domain';

describe('isSafeReturnPath', () => {
  it.each(['/', '/book/4f6d2a7e?serviceType=seasonal-heater-service&start=2030-01-07T09%3A00%3A00.000Z', '/bookings/1#top', '/search?place=Innsbruck%2C+Austria'])('keeps %s', (path) => {
    expect(isSafeReturnPath(path)).toBe(true);
  });

  it.each([
    'https://elsewhere.example/',
    '//elsewhere.example/book',
    '/\\elsewhere.example',
    '/\\/elsewhere.example',
    'book/1',
    'javascript:alert(1)',
    '/book\nSet-Cookie: x',
    '/book\t/1',
    '/ /elsewhere.example',
    `/${'a'.repeat(RETURN_PATH_MAX)}`,
  ])('refuses %j', (path) => {
    expect(isSafeReturnPath(path)).toBe(false);
  });

  it('refuses what is not a string', () => {
    for (const value of [undefined, null, 1, ['/book'], { path: '/' }]) expect(isSafeReturnPath(value)).toBe(false);
  });
});
