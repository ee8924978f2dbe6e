// Dashboard "Waiting for you": requests to answer for partner admins, soonest first, each linking
// to its booking; technicians do not get the card.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { listPartnerBookings } from '@/api/bookings';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';
import { listParts } from '@/api/offers';
import { mountDashboard } from './dashboard-fixtures';
import { ORG_A } from './fixtures';
import { BOOKING_ID, SECOND_ID, booking } from './booking-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/catalogue', () => ({ listServiceTypes: vi.fn(), listCapabilities: vi.fn() }));
vi.mock('@/api/offers', () => ({ listParts: vi.fn() }));
vi.mock('@/api/bookings', () => ({ listPartnerBookings: vi.fn(), getPartnerBooking: vi.fn(), decideBooking: vi.fn(), fetchBookingsCsv: vi.fn() }));


describe('Dashboard: waiting for you', () => {
  beforeEach(() => {
    localStorage.clear();
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(listServiceTypes).mockResolvedValue([]);
    vi.mocked(listCapabilities).mockResolvedValue([]);
    vi.mocked(listParts).mockResolvedValue([]);
  });

  it('lists the requests a partner admin has to answer, soonest first, linking to each', async () => {
    vi.mocked(listPartnerBookings).mockResolvedValue([
      booking({ id: SECOND_ID, reference: 'EMB-3M9D', start: '2026-03-12T13:00:00.000Z', end: '2026-03-12T14:00:00.000Z' }),
      booking(),
    ]);
    const wrapper = await mountDashboard('partner_admin');
    expect(listPartnerBookings).toHaveBeenCalledWith(ORG_A, { status: 'requested', limit: 100 }, expect.anything());
    const card = wrapper.find('[data-testid="waiting-card"]');
    expect(card.find('h2').text()).toBe('Waiting for you');
    expect(card.text()).toContain('2 requests need your answer');
    const links = card.findAll('li a');
    expect(links.map((a) => a.attributes('data-booking'))).toEqual([BOOKING_ID, SECOND_ID]);
    expect(links[0]!.text()).toContain('Tue 10 Mar, 09:00');
    expect(links[0]!.attributes('href')).toContain(`/bookings/${BOOKING_ID}`);
  });

  it('says when nothing is waiting', async () => {
    vi.mocked(listPartnerBookings).mockResolvedValue([]);
    const wrapper = await mountDashboard('partner_admin');
    expect(wrapper.find('[data-testid="waiting-card"] [data-state="empty"]').text()).toContain('No requests waiting');
  });

  it('is not shown to technicians', async () => {
    const wrapper = await mountDashboard('technician');
    expect(wrapper.find('[data-testid="waiting-card"]').exists()).toBe(false);
    // their own jobs load (for "Your day"), requests do not
    expect(listPartnerBookings).not.toHaveBeenCalledWith(expect.anything(), expect.objectContaining({ status: 'requested' }), expect.anything());
  });
});
