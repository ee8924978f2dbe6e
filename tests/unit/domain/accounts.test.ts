// Password rules shared by the forms and the API, and who sees an organisation's bookings.
import { describe, expect, it } from 'vitest';
import { OwnerSignUpSchema, PASSWORD_IS_EMAIL_MESSAGE, passwordMatchesEmail, passwordProblems, seesAllOrganisationBookings } from '@emberline/domain';

describe('password rules', () => {
  it('accepts a long, uncommon password', () => {
    expect(passwordProblems('anna@example.org', 'glow-pin-and-fuse-tap')).toEqual([]);
  });

  it.each([
    ['short1', /at least 10/],
    ['Password123!', /too common/],
    ['qwertzuiop', /too common/],
    ['aaaaaaaaaaaa', /too common/],
    ['1234567890', /too common/],
  ])('refuses %s', (password, message) => {
    expect(passwordProblems('anna@example.org', password).join(' ')).toMatch(message);
  });

  it('refuses the e-mail address or its local part, in any case', () => {
    expect(passwordMatchesEmail('Anna.Berg@Example.org', 'anna.berg@example.org')).toBe(true);
    expect(passwordMatchesEmail('anna.berg.longname@example.org', 'ANNA.BERG.LONGNAME')).toBe(true);
    expect(passwordMatchesEmail('anna@example.org', 'anna@example.org!')).toBe(false);
    expect(passwordProblems('anna.berg.longname@example.org', 'anna.berg.longname')).toEqual([PASSWORD_IS_EMAIL_MESSAGE]);
  });

  it('puts the e-mail rule on the password field of the sign-up schema', () => {
    const r = OwnerSignUpSchema.safeParse({ name: 'A', email: 'someone.long@example.org', password: 'someone.long@example.org' });
    expect(r.success).toBe(false);
    expect(r.error!.issues.find((i) => i.message === PASSWORD_IS_EMAIL_MESSAGE)?.path).toEqual(['password']);
  });
});

describe('seesAllOrganisationBookings', () => {
  it('gives partner admins and network admins every booking, a technician only their own', () => {
    expect(seesAllOrganisationBookings(['partner_admin'])).toBe(true);
    expect(seesAllOrganisationBookings(['network_admin'])).toBe(true);
    expect(seesAllOrganisationBookings(['owner', 'partner_admin'])).toBe(true);
    expect(seesAllOrganisationBookings(['technician'])).toBe(false);
    expect(seesAllOrganisationBookings(['owner', 'technician'])).toBe(false);
    expect(seesAllOrganisationBookings([])).toBe(false);
  });
});
