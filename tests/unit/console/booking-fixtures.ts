// Shared test data for the booking screens: bookings in each status, the technician's hours in
// Vienna and the free times for a move (all invented).
import type { Booking, BookingStatus, PartnerSlots, TechnicianHours } from '@emberline/domain';
import { ORG_A, team } from './fixtures';

export const ADMIN_ID = team.members[0]!.userId;
export const TECH_ID = team.members[1]!.userId;
export const BOOKING_ID = '5b0f3f8e-2c55-4d0b-9a53-6f1d7c3e9a10';
export const SECOND_ID = '8e6a4c21-93b7-4f0e-8d12-2a7b5c9e1f34';

/** A booking of Jonas Brandt's: Tuesday 10 March 2026, 09:00–10:30 in Vienna (UTC+1 then). */
export function booking(overrides: Partial<Booking> = {}): Booking {
  return {
    id: BOOKING_ID,
    reference: 'EMB-7K2Q',
    status: 'requested',
    partner: { id: ORG_A, name: 'Ember Vans North' },
    serviceType: { code: 'handset-pairing', name: 'Handset pairing and range check' },
    start: '2026-03-10T08:00:00.000Z',
    end: '2026-03-10T09:30:00.000Z',
    timeZone: 'Europe/Vienna',
    technician: { id: TECH_ID, name: 'Jonas Brandt' },
    jobAt: 'owner',
    address: { line: 'Lindengasse 12', postalCode: '6020', city: 'Innsbruck', country: 'AT', lat: 47.2654, lng: 11.3927 },
    workshopAddress: null,
    vehicle: { model: 'Panel van, long wheelbase', fuel: 'diesel', factoryHeater: 'none', climateControl: 'manual', electricalSystemV: 12, year: 2019 },
    customer: { kind: 'business', name: 'Pia Lechner', email: 'pia@lechner-transporte.example', phone: '+43 512 555 010', companyName: 'Lechner Transporte', vatId: 'ATU13585627' },
    notes: 'The van is in the yard behind the house.',
    quote: {
      currency: 'EUR',
      minorUnits: 2,
      lines: [
        { kind: 'labour', description: 'Handset pairing and range check', netMinor: 4500, vatRateBp: 2000, vatMinor: 900, grossMinor: 5400 },
        { kind: 'travel', description: 'Travel, 12 km', netMinor: 960, vatRateBp: 2000, vatMinor: 192, grossMinor: 1152 },
      ],
      netMinor: 5460,
      vatMinor: 1092,
      grossMinor: 6552,
      vat: { treatment: 'standard', country: 'AT', rateBp: 2000, validFrom: '2016-01-01', note: null },
      depositMinor: 0,
      cancellation: { freeUntilHours: 24, feeMinor: 1500 },
    },
    partnerQuote: { commissionBp: 1200, commissionMinor: 786, partnerShareMinor: 4548, processingFeeEstimateMinor: 126 },
    payment: { status: 'authorised', authorisedMinor: 6552, capturedMinor: 0, refundedMinor: 0 },
    holdExpiresAt: null,
    checkoutUrl: null,
    cancellationNow: { allowed: true, feeMinor: 0, refundMinor: 6552 },
    history: [
      { at: '2026-03-01T10:00:00.000Z', from: null, to: 'held', actor: 'owner', note: null },
      { at: '2026-03-01T10:03:00.000Z', from: 'held', to: 'requested', actor: 'system', note: null },
    ],
    createdAt: '2026-03-01T10:00:00.000Z',
    ...overrides,
  };
}

export const inStatus = (status: BookingStatus, overrides: Partial<Booking> = {}) => booking({ status, ...overrides });

/** A second booking: Thursday 12 March 2026, 14:00–15:00 in Vienna, confirmed. */
export const secondBooking = () =>
  booking({
    id: SECOND_ID,
    reference: 'EMB-3M9D',
    status: 'confirmed',
    start: '2026-03-12T13:00:00.000Z',
    end: '2026-03-12T14:00:00.000Z',
    customer: { kind: 'consumer', name: 'Aaron Sommer', email: 'aaron@sommer.example', phone: null, companyName: null, vatId: null },
    quote: { ...booking().quote, grossMinor: 9900 },
  });

export const viennaHours = (): TechnicianHours => ({
  organisationId: ORG_A,
  userId: TECH_ID,
  hours: {
    timeZone: 'Europe/Vienna',
    weekly: { monday: [{ start: '08:00', end: '17:00' }], tuesday: [{ start: '08:00', end: '17:00' }], wednesday: [], thursday: [], friday: [], saturday: [], sunday: [] },
    exceptions: [],
    minimumNoticeMinutes: 120,
    bookingHorizonDays: 90,
    bufferMinutes: 15,
  },
});

export const freeTimes = (): PartnerSlots => ({
  partnerId: ORG_A,
  serviceTypeCode: 'handset-pairing',
  durationMinutes: 90,
  timeZone: 'Europe/Vienna',
  organisation: [],
  technicians: [
    {
      technicianId: TECH_ID,
      timeZone: 'Europe/Vienna',
      slots: [
        { start: '2026-03-16T07:00:00.000Z', end: '2026-03-16T08:30:00.000Z', localStart: '2026-03-16T08:00+01:00' },
        { start: '2026-03-16T09:00:00.000Z', end: '2026-03-16T10:30:00.000Z', localStart: '2026-03-16T10:00+01:00' },
        { start: '2026-03-17T07:00:00.000Z', end: '2026-03-17T08:30:00.000Z', localStart: '2026-03-17T08:00+01:00' },
      ],
    },
    {
      technicianId: ADMIN_ID,
      timeZone: 'Europe/Vienna',
      slots: [{ start: '2026-03-18T12:00:00.000Z', end: '2026-03-18T13:30:00.000Z', localStart: '2026-03-18T13:00+01:00' }],
    },
  ],
  truncated: false,
});
