// The Console's landing page by role: a technician gets their day, a partner admin the team's
// jobs, requests, stock and what owners paid this month, a network admin the applications waiting
// and the coverage gaps with the catalogue; partners no longer get catalogue counts.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import type { Booking } from '@emberline/domain';
import { listPartnerBookings } from '@/api/bookings';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';
import { listParts } from '@/api/offers';
import { listApplications } from '@/api/onboarding';
import { getCoverageGaps } from '@/api/search-admin';
import { mountDashboard } from './dashboard-fixtures';
import { booking } from './booking-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/catalogue', () => ({ listServiceTypes: vi.fn(), listCapabilities: vi.fn() }));
vi.mock('@/api/offers', () => ({ listParts: vi.fn() }));
vi.mock('@/api/onboarding', () => ({ listApplications: vi.fn() }));
vi.mock('@/api/search-admin', () => ({ getCoverageGaps: vi.fn() }));
vi.mock('@/api/bookings', () => ({ listPartnerBookings: vi.fn(), getPartnerBooking: vi.fn(), decideBooking: vi.fn(), fetchBookingsCsv: vi.fn() }));

const NOW = new Date('2026-03-10T06:00:00Z');
const at = (iso: string, status: Booking['status'], id: string) => booking({ id, reference: `EMB-${id.slice(-4)}`, status, start: iso, end: iso });


describe('Dashboard by role', () => {
  beforeEach(() => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(NOW);
    localStorage.clear();
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(listServiceTypes).mockResolvedValue([]);
    vi.mocked(listCapabilities).mockResolvedValue([]);
    vi.mocked(listParts).mockResolvedValue([]);
    vi.mocked(listApplications).mockResolvedValue([]);
    vi.mocked(getCoverageGaps).mockResolvedValue({ data: [], meta: { days: 30, totalSearches: 0 } });
    vi.mocked(listPartnerBookings).mockImplementation(async (_org, q) =>
      q?.status === 'completed'
        ? [at('2026-03-02T08:00:00Z', 'completed', '00000000-0000-4000-8000-00000000c001'), at('2026-03-05T08:00:00Z', 'completed', '00000000-0000-4000-8000-00000000c002')]
        : [
            at('2026-03-10T08:00:00Z', 'confirmed', '00000000-0000-4000-8000-00000000a001'),
            at('2026-03-10T12:00:00Z', 'in_progress', '00000000-0000-4000-8000-00000000a002'),
            at('2026-03-12T09:00:00Z', 'confirmed', '00000000-0000-4000-8000-00000000a003'),
            at('2026-03-10T15:00:00Z', 'requested', '00000000-0000-4000-8000-00000000a004'),
          ],
    );
  });
  afterEach(() => vi.useRealTimers());

  it('a technician sees their day and the coming days, not the catalogue', async () => {
    const wrapper = await mountDashboard('technician');
    const jobs = wrapper.find('[data-testid="jobs-card"]');
    expect(jobs.find('h2').text()).toBe('Your day');
    expect(jobs.find('[data-testid="jobs-today"]').findAll('li a').map((a) => a.attributes('data-booking'))).toEqual(['00000000-0000-4000-8000-00000000a001', '00000000-0000-4000-8000-00000000a002']);
    expect(jobs.find('[data-testid="jobs-later"]').findAll('li')).toHaveLength(1);
    expect(jobs.text()).not.toContain('Jonas Brandt');
    expect(wrapper.find('[data-testid="waiting-card"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="revenue-card"]').exists()).toBe(false);
    expect(wrapper.text()).not.toContain('Catalogue at a glance');
    expect(wrapper.text()).not.toContain('Catalogue overview');
  });

  it('a partner admin sees the team’s jobs with who does them, requests, and what owners paid this month', async () => {
    const wrapper = await mountDashboard('partner_admin');
    const jobs = wrapper.find('[data-testid="jobs-card"]');
    expect(jobs.find('h2').text()).toBe('Jobs today and in the next six days');
    expect(jobs.text()).toContain('Jonas Brandt');
    expect(wrapper.find('[data-testid="waiting-card"]').exists()).toBe(true);
    const revenue = wrapper.find('[data-testid="revenue-card"]');
    expect(revenue.find('h2').text()).toBe('Paid by owners in March 2026');
    expect(revenue.text()).toContain('2 completed jobs');
    // two jobs of 65.52 each (the fixture's quote)
    expect(revenue.find('dd').text()).toBe('€131.04');
    expect(wrapper.text()).not.toContain('Catalogue at a glance');
  });

  it('a network admin sees applications waiting and coverage gaps beside the catalogue', async () => {
    vi.mocked(listApplications).mockResolvedValue([{} as never, {} as never]);
    vi.mocked(getCoverageGaps).mockResolvedValue({ data: [{ lat: 47.3, lng: 11.4, serviceTypeCode: 'seasonal-service', searches: 5, alerts: 1, lastSearchedAt: '2026-03-09T10:00:00Z' }], meta: { days: 30, totalSearches: 5 } });
    const wrapper = await mountDashboard(null, ['network_admin']);
    expect(listApplications).toHaveBeenCalledWith({ status: 'submitted', sort: 'waiting' }, expect.anything());
    expect(wrapper.find('[data-testid="network-applications"]').text()).toContain('2 applications waiting for a decision');
    expect(wrapper.find('[data-testid="network-gaps"]').text()).toContain('in one place in the last 30 days (5 searches)');
    expect(wrapper.find('[data-testid="jobs-card"]').exists()).toBe(false);
    expect(wrapper.text()).toContain('Catalogue overview');
  });
});
