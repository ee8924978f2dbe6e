// What the owner enters in the booking flow, kept as typed (strings for optional numbers), and
// the BookingRequest and quote query made from it. The draft survives the trip to the payment
// page in this tab's sessionStorage (per partner and offer), so coming back or "try again" after
// a decline does not start from scratch.
import { reactive } from 'vue';
import type { BookingRequest, CLIMATE_CONTROLS, Country, FactoryHeater, HeaterFuel, Vehicle } from '@emberline/domain';
import type { QuotePreviewRequest } from '@emberline/api-client';

type ClimateControl = (typeof CLIMATE_CONTROLS)[number];

export interface BookingDraft {
  /** A garage vehicle's id, or '' when the details are typed in. */
  vehicleId: string;
  vehicle: {
    model: string;
    year: string;
    fuel: HeaterFuel | '';
    factoryHeater: FactoryHeater | '';
    climateControl: ClimateControl | '';
    electricalSystemV: '' | '12' | '24';
  };
  address: { line: string; postalCode: string; city: string; country: Country | '' };
  /** Where the owner put the pin: where the vehicle will be. */
  pin: { lat: number; lng: number } | null;
  customerKind: 'consumer' | 'business';
  companyName: string;
  vatId: string;
  phone: string;
  notes: string;
}

/** What the route fixes: the partner, the service, the time and where the job happens. */
export interface BookingContext {
  partnerId: string;
  serviceType: string;
  start: string;
  technicianId?: string;
  jobAt: 'owner' | 'workshop';
}

/** Field paths as the API names them in problem details; the flow shows each beside its field. */
export const DRAFT_FIELDS = [
  'vehicle',
  'vehicle.model',
  'vehicle.year',
  'vehicle.fuel',
  'vehicle.factoryHeater',
  'vehicle.climateControl',
  'vehicle.electricalSystemV',
  'vehicleId',
  'address',
  'address.line',
  'address.postalCode',
  'address.city',
  'address.country',
  'address.lat',
  'address.lng',
  'customer',
  'customer.kind',
  'customer.companyName',
  'customer.vatId',
  'phone',
  'notes',
] as const;

export function emptyDraft(country: Country | '' = ''): BookingDraft {
  return {
    vehicleId: '',
    vehicle: { model: '', year: '', fuel: '', factoryHeater: '', climateControl: '', electricalSystemV: '' },
    address: { line: '', postalCode: '', city: '', country },
    pin: null,
    customerKind: 'consumer',
    companyName: '',
    vatId: '',
    phone: '',
    notes: '',
  };
}

export function useBookingDraft(country: Country | '' = '') {
  return reactive<BookingDraft>(emptyDraft(country));
}

export function applyVehicle(draft: BookingDraft, vehicle: Vehicle): void {
  draft.vehicleId = vehicle.id;
  draft.vehicle = {
    model: vehicle.model,
    year: String(vehicle.year),
    fuel: vehicle.fuel,
    factoryHeater: vehicle.factoryHeater,
    climateControl: vehicle.climateControl,
    electricalSystemV: String(vehicle.electricalSystemV) as '12' | '24',
  };
}

const text = (value: string) => value.trim();
const optional = (value: string) => value.trim() || undefined;
/** A typed year stays as typed when it is not a number, so the schema names the problem. */
const yearOf = (value: string) => (value.trim() === '' ? undefined : /^\d+$/.test(value.trim()) ? Number(value.trim()) : value.trim());

function vehicleOf(draft: BookingDraft) {
  const v = draft.vehicle;
  return {
    model: text(v.model),
    fuel: v.fuel || undefined,
    factoryHeater: v.factoryHeater || undefined,
    climateControl: v.climateControl || undefined,
    electricalSystemV: v.electricalSystemV ? (Number(v.electricalSystemV) as 12 | 24) : undefined,
    year: yearOf(v.year) as number | undefined,
  };
}

export function toBookingRequest(draft: BookingDraft, ctx: BookingContext): BookingRequest {
  const customer: BookingRequest['customer'] =
    draft.customerKind === 'business' ? { kind: 'business', companyName: text(draft.companyName), vatId: text(draft.vatId).replace(/\s+/g, '') } : { kind: 'consumer' };
  return {
    partnerId: ctx.partnerId,
    serviceType: ctx.serviceType,
    start: ctx.start,
    ...(ctx.technicianId ? { technicianId: ctx.technicianId } : {}),
    jobAt: ctx.jobAt,
    ...(ctx.jobAt === 'owner'
      ? {
          address: {
            line: text(draft.address.line),
            postalCode: text(draft.address.postalCode),
            city: text(draft.address.city),
            country: draft.address.country as Country,
            lat: draft.pin?.lat as number,
            lng: draft.pin?.lng as number,
          },
        }
      : {}),
    ...(draft.vehicleId ? { vehicleId: draft.vehicleId } : {}),
    vehicle: vehicleOf(draft),
    customer,
    ...(optional(draft.phone) ? { phone: optional(draft.phone) } : {}),
    ...(optional(draft.notes) ? { notes: optional(draft.notes) } : {}),
  };
}

export function toQuoteQuery(request: BookingRequest): QuotePreviewRequest {
  const v = request.vehicle;
  return {
    serviceType: request.serviceType,
    jobAt: request.jobAt,
    lat: request.address?.lat,
    lng: request.address?.lng,
    country: request.address?.country,
    start: request.start,
    vatId: request.customer.kind === 'business' ? request.customer.vatId : undefined,
    model: v.model,
    fuel: v.fuel,
    factoryHeater: v.factoryHeater,
    climateControl: v.climateControl,
    electricalSystemV: v.electricalSystemV as number | undefined,
    year: v.year as number | undefined,
  };
}

/** The quote query's field names as the booking form's paths, for errors from the preview. */
export const QUOTE_FIELD_PATHS: Record<string, string> = {
  lat: 'address.lat',
  lng: 'address.lng',
  country: 'address.country',
  vatId: 'customer.vatId',
  model: 'vehicle.model',
  fuel: 'vehicle.fuel',
  factoryHeater: 'vehicle.factoryHeater',
  climateControl: 'vehicle.climateControl',
  electricalSystemV: 'vehicle.electricalSystemV',
  year: 'vehicle.year',
};

const STORAGE_KEY = 'emberline.booking-draft';

/** What the flow keeps for one partner's offer: the entries, and the start held for payment. */
export interface SavedDraft {
  draft: BookingDraft;
  /** The start the owner held and went to pay for: coming back to it opens the pay step again. */
  heldStart: string | null;
}

interface Stored extends SavedDraft {
  partnerId: string;
  serviceType: string;
}

export function saveDraft(offer: { partnerId: string; serviceType: string }, draft: BookingDraft, heldStart: string | null = null): void {
  try {
    const stored: Stored = { partnerId: offer.partnerId, serviceType: offer.serviceType, draft, heldStart };
    sessionStorage.setItem(STORAGE_KEY, JSON.stringify(stored));
  } catch {
    /* private mode or full storage: the draft is a convenience */
  }
}

export function loadDraft(offer: { partnerId: string; serviceType: string }): SavedDraft | null {
  try {
    const saved = JSON.parse(sessionStorage.getItem(STORAGE_KEY) ?? 'null') as Partial<Stored> | null;
    if (!saved?.draft || saved.partnerId !== offer.partnerId || saved.serviceType !== offer.serviceType) return null;
    const base = emptyDraft();
    const draft = { ...base, ...saved.draft, vehicle: { ...base.vehicle, ...saved.draft.vehicle }, address: { ...base.address, ...saved.draft.address } };
    return { draft, heldStart: typeof saved.heldStart === 'string' ? saved.heldStart : null };
  } catch {
    return null;
  }
}

export function clearDraft(): void {
  try {
    sessionStorage.removeItem(STORAGE_KEY);
  } catch {
    /* nothing kept */
  }
}
