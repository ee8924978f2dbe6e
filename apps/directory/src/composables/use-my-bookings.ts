// The signed-in owner's bookings: the list, and one booking as the return page from the payments
// page needs it: released first after a cancelled payment, polled after a paid one until the
// payment's webhook has moved it on from `held`.
import { onScopeDispose, ref, shallowRef, watch, type Ref } from 'vue';
import type { Booking } from '@emberline/domain';
import { problemOf, useAsyncData } from '@emberline/ui';
import { getMyBooking, listMyBookings, releaseMyBooking } from '@/api/bookings';

export function useMyBookings() {
  return useAsyncData<Booking[]>((signal) => listMyBookings(signal));
}

/** How often, and for how long, the return page asks whether the payment has arrived. */
export const POLL_EVERY_MS = 1500;
export const POLL_FOR_MS = 30_000;

export type ReturnMode = 'paid' | 'cancelled' | null;

export function useMyBooking(bookingId: Ref<string>, mode: Ref<ReturnMode>) {
  const data = shallowRef<Booking | null>(null);
  const loading = ref(false);
  const error = shallowRef<unknown>(null);
  /** Waiting for the payment to be confirmed (status still `held` after a paid return). */
  const confirming = ref(false);
  /** Polling gave up while the booking was still `held`. */
  const timedOut = ref(false);
  let timer: ReturnType<typeof setTimeout> | null = null;
  let pollingSince = 0;
  let generation = 0;

  function stopPolling() {
    if (timer) clearTimeout(timer);
    timer = null;
    confirming.value = false;
  }

  /** After a cancelled payment: give the held time up; if it is no longer held, just read it. */
  async function release(id: string): Promise<Booking> {
    try {
      return await releaseMyBooking(id);
    } catch (err) {
      const status = problemOf(err)?.status;
      if (status === 409 || status === 422) return getMyBooking(id);
      throw err;
    }
  }

  async function refresh(): Promise<void> {
    const mine = ++generation;
    stopPolling();
    timedOut.value = false;
    loading.value = true;
    error.value = null;
    try {
      const id = bookingId.value;
      const booking = mode.value === 'cancelled' ? await release(id) : await getMyBooking(id);
      if (mine !== generation) return;
      data.value = booking;
      if (mode.value === 'paid' && booking.status === 'held') poll();
    } catch (err) {
      if (mine === generation) error.value = err;
    } finally {
      if (mine === generation) loading.value = false;
    }
  }

  /** Asks again every POLL_EVERY_MS until the status leaves `held`, for up to POLL_FOR_MS. */
  function poll(): void {
    const mine = generation;
    confirming.value = true;
    timedOut.value = false;
    pollingSince = Date.now();
    const tick = async () => {
      try {
        const booking = await getMyBooking(bookingId.value);
        if (mine !== generation) return;
        data.value = booking;
        if (booking.status !== 'held') {
          stopPolling();
          return;
        }
      } catch {
        // a failed look is retried with the next one; the page already shows the booking
      }
      if (mine !== generation) return;
      if (Date.now() - pollingSince >= POLL_FOR_MS) {
        stopPolling();
        timedOut.value = true;
        return;
      }
      timer = setTimeout(tick, POLL_EVERY_MS);
    };
    timer = setTimeout(tick, POLL_EVERY_MS);
  }

  /** Takes a booking an action returned (cancelled, rescheduled). */
  function set(booking: Booking): void {
    data.value = booking;
  }

  watch(bookingId, () => void refresh(), { immediate: true });
  onScopeDispose(() => {
    generation++;
    stopPolling();
  });
  return { data, loading, error, refresh, confirming, timedOut, poll, set };
}
