// Loads the technicians of offers with their working hours: shared by the search index, the
// partner profile, slots, quotes and bookings, so none of them needs to import another service.
import { WorkingHoursSchema, type WorkingHours } from '@emberline/domain';
import type { EntityManager } from 'typeorm';
import { json } from '../lib/json-column';

/**
 * The technicians assigned to each offer who are still members and have saved (valid) working
 * hours, in one query for any number of offers; the search and the slots of one partner share it.
 */
export async function offerTechnicians(manager: EntityManager, offerIds: readonly string[]): Promise<Map<string, { id: string; hours: WorkingHours }[]>> {
  const byOffer = new Map<string, { id: string; hours: WorkingHours }[]>();
  if (!offerIds.length) return byOffer;
  const rows: { offer_id: string; user_id: string; hours: unknown }[] = await manager.query(
    `SELECT ot.offer_id, ot.user_id, wh.hours FROM offer_technician ot
     JOIN membership m ON m.organisation_id = ot.organisation_id AND m.user_id = ot.user_id
     JOIN working_hours wh ON wh.organisation_id = ot.organisation_id AND wh.user_id = ot.user_id
     WHERE ot.offer_id IN (?) ORDER BY ot.offer_id, ot.user_id`,
    [offerIds],
  );
  for (const r of rows) {
    const hours = parseHours(r.hours);
    if (!hours) continue;
    const list = byOffer.get(r.offer_id) ?? [];
    list.push({ id: r.user_id, hours });
    byOffer.set(r.offer_id, list);
  }
  return byOffer;
}

/** Parsed working hours by their stored text: validating them (time zones above all) is costly, and they rarely change. */
const parsedHours = new Map<string, WorkingHours | null>();
const PARSED_HOURS_MAX = 5000;

export function parseHours(stored: unknown): WorkingHours | null {
  const text = typeof stored === 'string' ? stored : JSON.stringify(stored);
  let hours = parsedHours.get(text);
  if (hours === undefined) {
    const result = WorkingHoursSchema.safeParse(json(text));
    hours = result.success ? result.data : null;
    // the oldest entry goes first (a Map keeps insertion order)
    if (parsedHours.size >= PARSED_HOURS_MAX) parsedHours.delete(parsedHours.keys().next().value!);
    parsedHours.set(text, hours);
  }
  return hours;
}
