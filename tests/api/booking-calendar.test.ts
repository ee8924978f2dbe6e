// The booking's calendar file read by an independent iCalendar parser (ical.js): RFC 5545 and RFC 5546's PUBLISH.
import ICAL from 'ical.js';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bookingCalendar, calendarUid } from '../../apps/api/src/services/booking-calendar';
import { createTestApp, type TestApp } from '../setup/app';
import { bookablePartner, insertBooking, newOwner } from '../setup/bookings';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ MAIL_FROM: 'Test Network <no-reply@network.test>' });
});
afterAll(() => t.close());

async function confirmedBookingCalendar() {
  const partner = await bookablePartner(t.app, t.dataSource);
  const owner = await newOwner(t.app, t.dataSource);
  const start = new Date(Math.ceil((Date.now() + 3 * 86_400_000) / 3_600_000) * 3_600_000);
  const booking = await insertBooking(t.dataSource, { orgId: partner.orgId, technicianId: partner.technician.userId, ownerId: owner.userId, offerId: partner.offerId, start, status: 'confirmed' });
  const [{ trading_name: partnerName }] = await t.dataSource.query('SELECT trading_name FROM partner_profile WHERE organisation_id = ?', [partner.orgId]);
  const res = await request(t.app).get(`/api/bookings/${booking.id}/calendar.ics`).set({ authorization: `Bearer ${owner.accessToken}` }).expect(200);
  return { text: res.text, booking, start, partnerName: partnerName as string };
}

describe('booking calendar file', () => {
  it('parses as a PUBLISH calendar whose event names its organiser, times, UID and stamp', async () => {
    const { text, booking, start, partnerName } = await confirmedBookingCalendar();
    const calendar = new ICAL.Component(ICAL.parse(text));
    expect(calendar.name).toBe('vcalendar');
    expect(calendar.getFirstPropertyValue('version')).toBe('2.0');
    expect(calendar.getFirstPropertyValue('method')).toBe('PUBLISH');
    expect(calendar.getFirstPropertyValue('prodid')).toBeTruthy();

    const events = calendar.getAllSubcomponents('vevent');
    expect(events).toHaveLength(1);
    const event = events[0]!;
    // RFC 5546 §3.2.1: PUBLISH requires ORGANIZER; the partner, reached through the network's no-reply sender
    const organizer = event.getFirstProperty('organizer');
    // URI schemes are case-insensitive (RFC 3986 §3.1); the writer spells it MAILTO
    expect(organizer?.getFirstValue()).toMatch(/^mailto:no-reply@network\.test$/i);
    expect(organizer?.getParameter('cn')).toBe(partnerName);

    const dtstart = event.getFirstPropertyValue('dtstart') as ICAL.Time;
    const dtend = event.getFirstPropertyValue('dtend') as ICAL.Time;
    expect(dtstart.toJSDate().toISOString()).toBe(start.toISOString());
    expect(dtend.toJSDate().getTime() - dtstart.toJSDate().getTime()).toBe(30 * 60_000);
    expect(dtstart.zone?.tzid).toBe('UTC');
    expect(event.getFirstPropertyValue('uid')).toBe(calendarUid(booking.id));
    const stamp = event.getFirstPropertyValue('dtstamp') as ICAL.Time;
    expect(stamp).toBeInstanceOf(ICAL.Time);
    expect(Math.abs(stamp.toJSDate().getTime() - Date.now())).toBeLessThan(5 * 60_000);
    expect(event.getFirstPropertyValue('status')).toBe('CONFIRMED');
  });

  it('keeps a partner name with quotes, semicolons and colons readable as the organiser', () => {
    const start = new Date('2026-12-01T08:00:00Z');
    const text = bookingCalendar({
      id: 'b1', reference: 'R-1', status: 'confirmed', start, end: new Date(start.getTime() + 3_600_000), serviceName: 'Handset pairing',
      partnerName: 'Warm "Nord"; Süd: Heizung', organizerEmail: 'no-reply@network.test', place: 'Innsbruck', location: { lat: 47.26, lng: 11.39 }, sequence: 0, link: 'http://emberline.test/bookings/b1',
    });
    const event = new ICAL.Component(ICAL.parse(text)).getFirstSubcomponent('vevent')!;
    expect(event.getFirstProperty('organizer')?.getParameter('cn')).toBe("Warm 'Nord'; Süd: Heizung");
    expect((event.getFirstPropertyValue('dtstart') as ICAL.Time).toJSDate().toISOString()).toBe(start.toISOString());
  });
});
