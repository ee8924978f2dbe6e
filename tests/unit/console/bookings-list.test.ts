// Bookings table: the filters become the API's query, times show in each job's own zone, columns
// sort, and the CSV export asks for the same selection with the session's token.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { DateTime } from 'luxon';
import type { MemberRole } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { fetchBookingsCsv, listPartnerBookings } from '@/api/bookings';
import { getTeam } from '@/api/team';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import BookingsPage from '@/views/bookings/index.vue';
import { ORG_A, me, member, session, team } from './fixtures';
import { TECH_ID, booking, secondBooking } from './booking-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/team', () => ({ getTeam: vi.fn() }));
vi.mock('@/api/bookings', () => ({ listPartnerBookings: vi.fn(), fetchBookingsCsv: vi.fn(), getPartnerBooking: vi.fn(), decideBooking: vi.fn() }));

async function mountPage(path = '/bookings?from=2026-03-01', role: MemberRole = 'partner_admin') {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ memberships: [member(role)] })));
  const router = createAppRouter(createMemoryHistory());
  await router.push(path);
  await router.isReady();
  const wrapper = mount(BookingsPage, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  return { wrapper, router };
}

/** The user's local midnight at the start of a date, as the page sends it (the runner's zone varies). */
const midnight = (date: string) => DateTime.fromISO(date).startOf('day').toISO()!;
const lastQuery = () => vi.mocked(listPartnerBookings).mock.lastCall?.[1];
const rows = (wrapper: ReturnType<typeof mount>) => wrapper.findAll('tbody tr.ant-table-row');

describe('Console bookings table', () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(getTeam).mockResolvedValue(team);
    vi.mocked(listPartnerBookings).mockResolvedValue([booking(), secondBooking()]);
  });
  afterEach(() => vi.unstubAllGlobals());

  it('builds the query from status, dates, technician and search', async () => {
    const { wrapper, router } = await mountPage();
    expect(listPartnerBookings).toHaveBeenLastCalledWith(ORG_A, { limit: 500, from: midnight('2026-03-01') }, expect.anything());
    // the bound is the user's local midnight, whatever zone the runner is in
    expect(DateTime.fromISO(lastQuery()!.from!).toISODate()).toBe('2026-03-01');
    expect(DateTime.fromISO(lastQuery()!.from!).hour).toBe(0);

    await wrapper.find('[data-testid="filter-status"] select').setValue('confirmed');
    await flushPromises();
    expect(lastQuery()).toEqual({ limit: 500, from: midnight('2026-03-01'), status: 'confirmed' });

    // "until" is the last day shown: the bound is the midnight after it
    await wrapper.find('input[data-testid="filter-to"]').setValue('2026-03-31');
    await flushPromises();
    expect(lastQuery()).toEqual({ limit: 500, from: midnight('2026-03-01'), to: midnight('2026-04-01'), status: 'confirmed' });

    await wrapper.find('[data-testid="filter-technician"] select').setValue(TECH_ID);
    await flushPromises();
    expect(lastQuery()).toMatchObject({ technicianId: TECH_ID });

    await wrapper.find('input[data-testid="filter-q"]').setValue('  Lechner ');
    await wrapper.find('form[data-testid="bookings-filters"]').trigger('submit');
    await flushPromises();
    expect(lastQuery()).toEqual({ limit: 500, from: midnight('2026-03-01'), to: midnight('2026-04-01'), status: 'confirmed', technicianId: TECH_ID, q: 'Lechner' });
    // the filters stay in the address, so going back from a booking keeps them
    expect(router.currentRoute.value.query).toEqual({ from: '2026-03-01', to: '2026-03-31', status: 'confirmed', technician: TECH_ID, q: 'Lechner' });
  });

  it('starts at today when the address names no dates, and drops every filter on request', async () => {
    vi.mocked(listPartnerBookings).mockResolvedValue([]);
    const { wrapper } = await mountPage('/bookings');
    expect(lastQuery()).toEqual({ limit: 500, from: midnight(DateTime.now().toISODate()!) });
    expect(wrapper.find('[data-state="empty"]').text()).toContain('No upcoming bookings');
    await wrapper.find('[data-testid="clear-filters"]').trigger('click');
    await flushPromises();
    expect(lastQuery()).toEqual({ limit: 500 });
    expect(wrapper.find('[data-state="empty"]').text()).toContain('No bookings yet');
  });

  it('shows each booking at its local time with customer, service, technician, status and total', async () => {
    const { wrapper } = await mountPage();
    expect(wrapper.findAll('thead th').map((th) => th.text())).toEqual(['Start', 'Reference', 'Customer', 'Service', 'Technician', 'Status', 'Total']);
    const first = rows(wrapper)[0]!.findAll('td').map((td) => td.text());
    // 08:00 UTC is 09:00 in Vienna, wherever the test runs
    expect(first[0]).toBe('Tue, 10 Mar 2026, 09:00');
    expect(first[1]).toBe('EMB-7K2Q');
    expect(first[2]).toBe('Pia LechnerLechner Transporte');
    expect(first.slice(3)).toEqual(['Handset pairing and range check', 'Jonas Brandt', 'Needs your answer', '€65.52']);
    expect(rows(wrapper)[0]!.find('a').attributes('href')).toContain('/bookings/5b0f3f8e-2c55-4d0b-9a53-6f1d7c3e9a10');
    expect(wrapper.find('[role="status"]').text()).toBe('2 bookings');
  });

  it('sorts by a column and back, saying so on the header', async () => {
    const { wrapper } = await mountPage();
    const references = () => rows(wrapper).map((r) => r.findAll('td')[1]!.text());
    const header = (key: string) => wrapper.find(`button[data-sort="${key}"]`);
    const th = (key: string) => wrapper.findAll('thead th').find((cell) => cell.find(`button[data-sort="${key}"]`).exists())!;
    expect(references()).toEqual(['EMB-7K2Q', 'EMB-3M9D']);
    expect(th('start').attributes('aria-sort')).toBe('ascending');
    // the total sorts highest first, then the other way round
    await header('total').trigger('click');
    expect(references()).toEqual(['EMB-3M9D', 'EMB-7K2Q']);
    expect(th('total').attributes('aria-sort')).toBe('descending');
    expect(th('start').attributes('aria-sort')).toBeUndefined();
    await header('total').trigger('click');
    expect(references()).toEqual(['EMB-7K2Q', 'EMB-3M9D']);
    expect(th('total').attributes('aria-sort')).toBe('ascending');
    await header('customer').trigger('click');
    expect(references()).toEqual(['EMB-3M9D', 'EMB-7K2Q']);
    expect(header('customer').text()).toBe('Customer');
  });

  it('exports the filtered selection as CSV and saves it as a file', async () => {
    vi.mocked(fetchBookingsCsv).mockResolvedValue({ blob: new Blob(['reference\nEMB-7K2Q\n'], { type: 'text/csv' }), fileName: 'bookings-2026-03.csv' });
    const createObjectURL = vi.fn(() => 'blob:bookings');
    vi.stubGlobal('URL', Object.assign(URL, { createObjectURL, revokeObjectURL: vi.fn() }));
    const clicks: string[] = [];
    const click = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      clicks.push(`${this.download} ${this.href}`);
    });
    const { wrapper } = await mountPage('/bookings?from=2026-03-01&status=requested&q=Pia');
    await wrapper.find('[data-testid="export-csv"]').trigger('click');
    await flushPromises();
    expect(fetchBookingsCsv).toHaveBeenCalledWith(ORG_A, { limit: 500, from: midnight('2026-03-01'), status: 'requested', q: 'Pia' });
    expect(createObjectURL).toHaveBeenCalledTimes(1);
    expect(clicks).toEqual(['bookings-2026-03.csv blob:bookings']);
    click.mockRestore();
  });

  it('fetches the CSV from the export path with the bearer token', async () => {
    await mountPage();
    const actual = await vi.importActual<typeof import('@/api/bookings')>('@/api/bookings');
    const fetch = vi.fn(async () => new Response('reference\n', { status: 200, headers: { 'content-type': 'text/csv', 'content-disposition': 'attachment; filename="bookings.csv"' } }));
    vi.stubGlobal('fetch', fetch);
    const result = await actual.fetchBookingsCsv(ORG_A, { status: 'requested', from: '2026-03-01T00:00:00.000+01:00', q: 'Pia', limit: 500 });
    expect(result.fileName).toBe('bookings.csv');
    expect(await result.blob.text()).toBe('reference\n');
    const [url, init] = fetch.mock.calls[0] as unknown as [string, RequestInit];
    // the export has no row limit: the list's limit stays out of its address
    expect(url).toBe(`/api/orgs/${ORG_A}/bookings.csv?status=requested&from=2026-03-01T00%3A00%3A00.000%2B01%3A00&q=Pia`);
    expect((init.headers as Record<string, string>).authorization).toBe('Bearer access-1');
  });

  it('says plainly when the export fails', async () => {
    const { problem } = await import('./fixtures');
    vi.mocked(fetchBookingsCsv).mockRejectedValue(problem(403, 'FORBIDDEN', 'Only members of this organisation can export its bookings.'));
    const { wrapper } = await mountPage();
    await wrapper.find('[data-testid="export-csv"]').trigger('click');
    await flushPromises();
    expect(wrapper.find('.ant-alert-error').text()).toContain('Only members of this organisation can export its bookings.');
  });

  it('shows a technician their own jobs, with no one else to filter by', async () => {
    vi.mocked(listPartnerBookings).mockResolvedValue([]);
    // an address that names another technician (e.g. shared by an admin) narrows nothing
    const { wrapper } = await mountPage(`/bookings?from=2026-03-01&technician=${TECH_ID}`, 'technician');
    expect(wrapper.find('h2').text()).toBe('Your jobs');
    expect(wrapper.find('.page__lead').text()).toContain('The jobs assigned to you');
    expect(wrapper.find('[data-testid="filter-technician"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="filter-status"]').exists()).toBe(true);
    expect(lastQuery()).toEqual({ limit: 500, from: midnight('2026-03-01') });
    await wrapper.find('[data-testid="clear-filters"]').trigger('click');
    await flushPromises();
    expect(wrapper.find('[data-state="empty"]').text()).toContain('When a job is assigned to you');
    expect(wrapper.find('[data-testid="export-csv"]').exists()).toBe(true);
  });

  it('shows the error with a retry when the list cannot be read', async () => {
    vi.mocked(listPartnerBookings).mockRejectedValueOnce(new Error('boom'));
    const { wrapper } = await mountPage();
    expect(wrapper.find('[data-state="error"]').exists()).toBe(true);
    await wrapper.find('[data-state="error"] button').trigger('click');
    await flushPromises();
    expect(rows(wrapper)).toHaveLength(2);
  });
});
