// The card numbers the payments fake accepts, and what each one does.
// Source: Stripe documentation: testing — test card numbers (a success card, a generic decline and
// an insufficient-funds decline, with the error code and decline code each one answers).

export type CardOutcome =
  | { kind: 'authorised' }
  | { kind: 'declined'; code: 'card_declined'; declineCode: 'generic_decline' | 'insufficient_funds'; message: string };

export interface TestCard {
  number: string;
  /** What the test payment page lists next to the number. */
  label: string;
  outcome: CardOutcome;
}

export const TEST_CARDS: readonly TestCard[] = [
  { number: '4242424242424242', label: 'succeeds', outcome: { kind: 'authorised' } },
  {
    number: '4000000000000002',
    label: 'declined: generic decline',
    outcome: { kind: 'declined', code: 'card_declined', declineCode: 'generic_decline', message: 'Your card was declined.' },
  },
  {
    number: '4000000000009995',
    label: 'declined: insufficient funds',
    outcome: { kind: 'declined', code: 'card_declined', declineCode: 'insufficient_funds', message: 'Your card has insufficient funds.' },
  },
];

export const normaliseCardNumber = (raw: string) => raw.replace(/[\s-]/g, '');

export function findTestCard(raw: string): TestCard | undefined {
  const digits = normaliseCardNumber(raw);
  return TEST_CARDS.find((c) => c.number === digits);
}

/** "4242 4242 4242 4242" */
export const groupCardNumber = (digits: string) => digits.replace(/(\d{4})(?=\d)/g, '$1 ');

export interface CardDetails {
  number: string;
  /** "MM/YY" or "MM/YYYY"; test cards take any date in the future. */
  expiry: string;
  /** Any three or four digits. */
  cvc: string;
}

export type CardCheck =
  | { ok: true; card: TestCard; expMonth: number; expYear: number; last4: string }
  | { ok: false; field: 'number' | 'expiry' | 'cvc'; message: string };

/** Checks a card as a test double would: only the documented test numbers, a future expiry, a CVC. */
export function checkCard(details: CardDetails, now: Date): CardCheck {
  const card = findTestCard(details.number);
  if (!card) {
    const list = TEST_CARDS.map((c) => `${groupCardNumber(c.number)} (${c.label})`).join(', ');
    return { ok: false, field: 'number', message: `This is a test payment page: use one of the test card numbers ${list}.` };
  }
  const m = /^\s*(\d{1,2})\s*\/\s*(\d{2}|\d{4})\s*$/.exec(details.expiry);
  if (!m) return { ok: false, field: 'expiry', message: 'Enter the expiry date as MM/YY.' };
  const expMonth = Number(m[1]);
  const expYear = m[2]!.length === 2 ? 2000 + Number(m[2]) : Number(m[2]);
  if (expMonth < 1 || expMonth > 12) return { ok: false, field: 'expiry', message: 'The expiry month must be between 01 and 12.' };
  // a card is valid through the last day of its expiry month
  if (expYear < now.getUTCFullYear() || (expYear === now.getUTCFullYear() && expMonth < now.getUTCMonth() + 1)) {
    return { ok: false, field: 'expiry', message: 'The expiry date is in the past; any future date works for test cards.' };
  }
  if (!/^\s*\d{3,4}\s*$/.test(details.cvc)) return { ok: false, field: 'cvc', message: 'The security code (CVC) is three or four digits.' };
  return { ok: true, card, expMonth, expYear, last4: card.number.slice(-4) };
}
