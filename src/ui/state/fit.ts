/**
 * Which catalog products fit a fixture entry. Each candidate is run through
 * the real calculation (a one-room copy of the survey with the product
 * proposed), so "enough light" uses the engine's own lumen ratio and the
 * reasons match the warnings the entry would get.
 */
import { calculateSurvey, type EntryResult } from '../../calc/survey.ts';
import type { CatalogProduct, FixtureEntry, MoistureRating, Room, Survey } from '../../survey/model.ts';
import { proposalFromCatalog } from '../../survey/examples.ts';

/** One candidate with the reasons it does not fit (none when it fits). */
export interface Candidate {
  product: CatalogProduct;
  reasons: string[];
  /** Engine result for the entry with this product proposed; null when the calculation refused it. */
  result: EntryResult | null;
}

const moistureRank: Readonly<Record<MoistureRating, number>> = { dry: 0, damp: 1, wet: 2 };

/**
 * Reasons a product's ratings do not suit where the fixture is.
 *
 * @example ratingProblems(nonDimmableLamp, entryOnDimmer) //=> ['not dimmable, and this circuit has a dimmer']
 */
export function ratingProblems(product: CatalogProduct, entry: FixtureEntry): string[] {
  const c = entry.conditions;
  const reasons: string[] = [];
  if (c.dimmer !== 'none' && c.dimmer !== '0-10v' && !product.dimmable) reasons.push('not dimmable, and this circuit has a dimmer');
  if (c.dimmer === '0-10v' && !product.dimmable) reasons.push('not dimmable by the 0-10 V control');
  if (c.enclosed && !product.enclosedRated) reasons.push('not rated for enclosed fixtures');
  if (moistureRank[product.moistureRating] < moistureRank[c.location]) reasons.push(`rated for ${product.moistureRating} locations only; this one is ${c.location}`);
  if (c.emergencyCircuit && !product.emergencyListed) reasons.push('not listed for emergency circuits');
  if (c.insulationContact && product.form === 'luminaire' && !product.insulationContactRated) reasons.push('not IC-rated, and the fixture touches insulation');
  return reasons;
}

/**
 * Every active catalog product judged for `entry` in `room`: those that fit
 * first (closest to today's light output), then the rest with their reasons.
 *
 * @example judgeProducts(survey, room, entry, catalog)[0].reasons //=> [] when at least one product fits
 */
export function judgeProducts(survey: Survey, room: Room, entry: FixtureEntry, catalog: readonly CatalogProduct[]): Candidate[] {
  const candidates = catalog
    .filter((product) => !product.retired)
    .map((product): Candidate => {
      const reasons = ratingProblems(product, entry);
      const trial: FixtureEntry = { ...entry, proposed: proposalFromCatalog(product) };
      let result: EntryResult | null = null;
      try {
        result = calculateSurvey({ ...survey, rooms: [{ ...room, entries: [trial] }] }).rooms[0]?.entries[0] ?? null;
      } catch {
        reasons.push('the calculation cannot use it here');
      }
      if (result?.lumenVerdict === 'short') reasons.push(`too little light: ${Math.round((result.lumenRatio ?? 0) * 100)} % of today’s`);
      if (result?.lumenVerdict === 'over') reasons.push(`far more light than today: ${Math.round((result.lumenRatio ?? 0) * 100)} %`);
      return { product, reasons, result };
    });
  const distance = (candidate: Candidate) => Math.abs((candidate.result?.lumenRatio ?? 2) - 1);
  return candidates.sort((a, b) => a.reasons.length - b.reasons.length || distance(a) - distance(b) || a.product.name.localeCompare(b.product.name));
}
