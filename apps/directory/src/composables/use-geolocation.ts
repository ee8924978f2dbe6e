// "Use my location": one position from the browser, with a reason when there is none.
import { ref } from 'vue';

export type GeolocationProblem = 'unsupported' | 'denied' | 'unavailable' | 'timeout';

/** Rounded to about 100 m: enough to find technicians, no more precise than that. */
const round = (n: number) => Math.round(n * 1000) / 1000;

export function useGeolocation() {
  const locating = ref(false);
  const problem = ref<GeolocationProblem | null>(null);

  function locate(): Promise<{ lat: number; lng: number } | null> {
    problem.value = null;
    const geo = typeof navigator !== 'undefined' ? navigator.geolocation : undefined;
    if (!geo || (typeof window !== 'undefined' && window.isSecureContext === false)) {
      problem.value = 'unsupported';
      return Promise.resolve(null);
    }
    locating.value = true;
    return new Promise((resolve) => {
      geo.getCurrentPosition(
        (position) => {
          locating.value = false;
          resolve({ lat: round(position.coords.latitude), lng: round(position.coords.longitude) });
        },
        (error) => {
          locating.value = false;
          // GeolocationPositionError codes: 1 permission denied, 2 position unavailable, 3 timeout
          problem.value = error.code === 1 ? 'denied' : error.code === 3 ? 'timeout' : 'unavailable';
          resolve(null);
        },
        { enableHighAccuracy: false, timeout: 10_000, maximumAge: 300_000 },
      );
    });
  }

  return { locating, problem, locate };
}
