// The bookable service types, asked for once and shared by every part of the page that shows them
// (the header's search form on every page, the home catalogue, the search page).
import { defineStore } from 'pinia';
import type { ServiceType } from '@emberline/domain';
import { listServiceTypes } from '@/api/catalogue';

export const useCatalogueStore = defineStore('catalogue', () => {
  let serviceTypes: Promise<ServiceType[]> | null = null;

  /** One request for every caller; a failed one is forgotten, so a retry asks again. */
  function bookableServiceTypes(): Promise<ServiceType[]> {
    if (!serviceTypes) {
      const request = listServiceTypes().then((list) => list.filter((s) => !s.retired));
      serviceTypes = request;
      request.catch(() => {
        if (serviceTypes === request) serviceTypes = null;
      });
    }
    return serviceTypes;
  }

  return { bookableServiceTypes };
});
