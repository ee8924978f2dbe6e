// Drafts shared by the service-area page and its forms.
import type { Currency } from '@emberline/domain';

/** The travel policy as typed: the rate in major units per km (0.80), null where a field is empty. */
export interface PolicyDraft {
  freeWithinKm: number | null;
  ratePerKm: number | null;
  currency: Currency;
  maxDistanceKm: number | null;
}

/** A place on the map (the base, or a customer's place in the previews). */
export interface MapPoint {
  lat: number;
  lng: number;
}
