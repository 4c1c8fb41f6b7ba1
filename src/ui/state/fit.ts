/**
 * Which catalog products fit a fixture entry. The constraints, reasons and
 * order come from the automatic product choice (`src/calc/choice.ts`), so the
 * picker and "choose for me" always agree; each candidate is also run through
 * the real calculation (a one-room copy of the survey with the product
 * proposed) for the figures the picker shows.
 */
import { explainEntry, ratingReasons } from '../../calc/choice.ts';
import { calculateSurvey, type EntryResult } from '../../calc/survey.ts';
import type { CatalogProduct, FixtureEntry, Room, Survey } from '../../survey/model.ts';
import { proposalFromCatalog } from '../../survey/examples.ts';

/** One candidate with the reasons it does not fit (none when it fits). */
export interface Candidate {
  product: CatalogProduct;
  reasons: string[];
  /** Engine result for the entry with this product proposed; null when the calculation refused it. */
  result: EntryResult | null;
}

/**
 * Reasons a product's ratings do not suit where the fixture is.
 *
 * @example ratingProblems(nonDimmableLamp, entryOnDimmer) //=> ['not dimmable, and this circuit has a dimmer']
 */
export function ratingProblems(product: CatalogProduct, entry: FixtureEntry): string[] {
  return ratingReasons(product, entry.conditions).map((reason) => reason.message);
}

/**
 * Every active catalog product judged for `entry` in `room`: those that fit
 * first (lowest life-cycle cost first), then the rest with their reasons.
 *
 * @example judgeProducts(survey, room, entry, catalog)[0].reasons //=> [] when at least one product fits
 */
export function judgeProducts(survey: Survey, room: Room, entry: FixtureEntry, catalog: readonly CatalogProduct[]): Candidate[] {
  // Judge the entry as given (it may be an edited copy of the one in the survey).
  const withEntry: Survey = {
    ...survey,
    rooms: [{ ...room, entries: room.entries.some((e) => e.id === entry.id) ? room.entries.map((e) => (e.id === entry.id ? entry : e)) : [...room.entries, entry] }],
  };
  const byId = new Map(catalog.map((product) => [product.id, product]));
  let judged: { productId: string | null; reasons: string[] }[];
  try {
    judged = explainEntry(withEntry, catalog, entry.id).candidates.map((c) => ({ productId: c.productId, reasons: c.reasons.map((r) => r.message) }));
  } catch {
    judged = catalog.map((product) => ({ productId: product.id, reasons: ['the calculation cannot use it here'] }));
  }
  const out: Candidate[] = [];
  for (const { productId, reasons } of judged) {
    const product = productId === null ? undefined : byId.get(productId);
    if (!product || product.retired) continue;
    const trial: FixtureEntry = { ...entry, proposed: proposalFromCatalog(product) };
    let result: EntryResult | null = null;
    try {
      result = calculateSurvey({ ...survey, rooms: [{ ...room, entries: [trial] }] }).rooms[0]?.entries[0] ?? null;
    } catch {
      if (reasons.length === 0) reasons.push('the calculation cannot use it here');
    }
    out.push({ product, reasons, result });
  }
  // Fitting products first (lowest life-cycle cost first, as the automatic choice ranks them), then the rest.
  return out.sort((a, b) => Number(a.reasons.length > 0) - Number(b.reasons.length > 0));
}
