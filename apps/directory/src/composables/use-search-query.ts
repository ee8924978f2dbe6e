// The search as it lives in the URL (so a search is shareable and back/forward work): parsing the
// route query, writing it back without defaults, and turning it into the API's request.
import type { LocationQuery, LocationQueryRaw } from 'vue-router';
import {
  CLIMATE_CONTROLS,
  CURRENCIES,
  DEFAULT_SEARCH_RADIUS_KM,
  FACTORY_HEATERS,
  HEATER_FUELS,
  SEARCH_MODES,
  SEARCH_SORTS,
  type Currency,
  type SearchRequest,
  type Vehicle,
} from '@emberline/domain';

export type SearchMode = (typeof SEARCH_MODES)[number];
export type SearchSortKey = (typeof SEARCH_SORTS)[number];

/** The vehicle as the form holds it: '' means "not given" (the search treats it as unknown). */
export interface VehicleFields {
  model: string;
  fuel: (typeof HEATER_FUELS)[number] | '';
  factoryHeater: (typeof FACTORY_HEATERS)[number] | '';
  climateControl: (typeof CLIMATE_CONTROLS)[number] | '';
  electricalSystemV: '12' | '24' | '';
  year: string;
}
export type VehicleField = keyof VehicleFields;
export const VEHICLE_FIELDS: readonly VehicleField[] = ['model', 'fuel', 'factoryHeater', 'climateControl', 'electricalSystemV', 'year'];

export interface SearchState {
  /** The place's name as shown, or what the owner typed before it was looked up. */
  place: string;
  lat: number | null;
  lng: number | null;
  service: string;
  radiusKm: number;
  mode: SearchMode;
  maxPriceMinor: number | null;
  currency: Currency | null;
  /** YYYY-MM-DD or ''. */
  date: string;
  sort: SearchSortKey;
  /** The garage vehicle the fields came from, if any. */
  vehicleId: string;
  vehicle: VehicleFields;
}

const first = (value: LocationQuery[string] | undefined): string => {
  const v = Array.isArray(value) ? value[0] : value;
  return typeof v === 'string' ? v.trim() : '';
};
const oneOf = <T extends string>(value: string, allowed: readonly T[]): T | '' => ((allowed as readonly string[]).includes(value) ? (value as T) : '');
const finite = (value: string): number | null => {
  if (!value) return null;
  const n = Number(value);
  return Number.isFinite(n) ? n : null;
};

/** The search from the route query; unknown or malformed values fall back to "not given". */
export function parseSearchQuery(query: LocationQuery): SearchState {
  const lat = finite(first(query.lat));
  const lng = finite(first(query.lng));
  const radius = finite(first(query.radiusKm));
  const maxPrice = finite(first(query.maxPriceMinor));
  return {
    place: first(query.place),
    lat: lat !== null && lng !== null ? lat : null,
    lng: lat !== null && lng !== null ? lng : null,
    service: first(query.service),
    radiusKm: radius !== null && radius > 0 ? Math.round(radius) : DEFAULT_SEARCH_RADIUS_KM,
    mode: oneOf(first(query.mode), SEARCH_MODES) || 'any',
    maxPriceMinor: maxPrice !== null && maxPrice >= 0 ? Math.round(maxPrice) : null,
    currency: oneOf(first(query.currency), CURRENCIES) || null,
    date: /^\d{4}-\d{2}-\d{2}$/.test(first(query.date)) ? first(query.date) : '',
    sort: oneOf(first(query.sort), SEARCH_SORTS) || 'best',
    vehicleId: first(query.vehicle),
    vehicle: {
      model: first(query.model).slice(0, 120),
      fuel: oneOf(first(query.fuel), HEATER_FUELS),
      factoryHeater: oneOf(first(query.factoryHeater), FACTORY_HEATERS),
      climateControl: oneOf(first(query.climateControl), CLIMATE_CONTROLS),
      electricalSystemV: oneOf(first(query.electricalSystemV), ['12', '24'] as const),
      year: /^\d{1,4}$/.test(first(query.year)) ? first(query.year) : '',
    },
  };
}

/** The route query of a search: defaults and empty values left out, keys in a stable order. */
export function toRouteQuery(s: SearchState): LocationQueryRaw {
  const q: Record<string, string> = {};
  if (s.place) q.place = s.place;
  if (s.lat !== null && s.lng !== null) {
    q.lat = String(s.lat);
    q.lng = String(s.lng);
  }
  if (s.service) q.service = s.service;
  if (s.radiusKm !== DEFAULT_SEARCH_RADIUS_KM) q.radiusKm = String(s.radiusKm);
  if (s.mode !== 'any') q.mode = s.mode;
  if (s.maxPriceMinor !== null && s.currency) {
    q.maxPriceMinor = String(s.maxPriceMinor);
    q.currency = s.currency;
  }
  if (s.date) q.date = s.date;
  if (s.sort !== 'best') q.sort = s.sort;
  return { ...q, ...vehicleRouteQuery(s.vehicleId, s.vehicle) };
}

/** The vehicle part of a route query, carried from the search to the profile and on to the booking form. */
export function vehicleRouteQuery(vehicleId: string, vehicle: VehicleFields): Record<string, string> {
  const q: Record<string, string> = {};
  if (vehicleId) q.vehicle = vehicleId;
  for (const field of VEHICLE_FIELDS) if (vehicle[field]) q[field] = vehicle[field];
  return q;
}

/** The API request, or null while the place or the service is missing. Values are checked by the schema. */
export function toSearchRequest(s: SearchState): SearchRequest | null {
  if (s.lat === null || s.lng === null || !s.service) return null;
  const v = s.vehicle;
  const request: SearchRequest = { serviceType: s.service, lat: s.lat, lng: s.lng, radiusKm: s.radiusKm, mode: s.mode, sort: s.sort };
  if (s.maxPriceMinor !== null && s.currency) {
    request.maxPriceMinor = s.maxPriceMinor;
    request.currency = s.currency;
  }
  if (s.date) request.date = s.date;
  if (v.model) request.model = v.model;
  if (v.fuel) request.fuel = v.fuel;
  if (v.factoryHeater) request.factoryHeater = v.factoryHeater;
  if (v.climateControl) request.climateControl = v.climateControl;
  if (v.electricalSystemV) request.electricalSystemV = Number(v.electricalSystemV);
  if (v.year) request.year = Number(v.year);
  return request;
}

/** A garage vehicle as form fields. */
export function vehicleFieldsOf(vehicle: Vehicle): VehicleFields {
  return {
    model: vehicle.model,
    fuel: vehicle.fuel,
    factoryHeater: vehicle.factoryHeater,
    climateControl: vehicle.climateControl,
    electricalSystemV: String(vehicle.electricalSystemV) as '12' | '24',
    year: String(vehicle.year),
  };
}

/** Which form field shows an error at a schema or problem-details path ("query.year" → "year"). */
export function fieldOfPath(path: string): string {
  const key = path.replace(/^query\./, '').split('.')[0] ?? '';
  if (key === 'serviceType') return 'service';
  if (key === 'lat' || key === 'lng') return 'place';
  if (key === 'currency') return 'maxPriceMinor';
  return key;
}

/** A place the search can use: a name to show and its coordinates. */
export interface PlacePoint {
  label: string;
  lat: number;
  lng: number;
}

/** The search form before it is sent: the place may still be only typed text. */
export interface SearchDraft {
  placeText: string;
  place: PlacePoint | null;
  service: string;
  vehicleId: string;
  vehicle: VehicleFields;
}

export function draftOf(s: SearchState): SearchDraft {
  return {
    placeText: s.place,
    place: s.lat !== null && s.lng !== null ? { label: s.place, lat: s.lat, lng: s.lng } : null,
    service: s.service,
    vehicleId: s.vehicleId,
    vehicle: { ...s.vehicle },
  };
}
