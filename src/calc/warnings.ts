/**
 * Compatibility and safety warnings. Each warning has a stable `code` (kept
 * across versions so reports, filters and tests can rely on it), a severity,
 * a plain message about this fixture, and what to do about it.
 *
 * Severity:
 * - `danger`: a hazard to people or property (shock, fire, toxic waste, lost
 *   egress lighting) — fix before anything is ordered or installed.
 * - `caution`: the swap will likely fail, flicker, wear out early or not meet
 *   the need — change the product or the plan.
 * - `advice`: worth checking or recording; does not stop the job.
 *
 * Every warning about wiring, heat or life safety ends with
 * {@link safetyDeferral}.
 */
import type { FixtureConditions, FixtureEntry, MoistureRating, ProposedProduct, Room, UnitsSystem } from '../survey/model.ts';
import { displayUnits, toDisplay } from './units.ts';

export type Severity = 'danger' | 'caution' | 'advice';

export type WarningCode =
  | 'dimmer-non-dimmable'
  | 'dimmer-compatibility'
  | 'enclosed-not-rated'
  | 'moisture-not-rated'
  | 'emergency-circuit'
  | 'insulation-contact'
  | 'ballast-bypass'
  | 'fixture-rewired'
  | 'ballast-compatibility'
  | 'pcb-ballast'
  | 'pcb-ballast-unknown'
  | 'mercury-lamps'
  | 'low-cri'
  | 'mixed-cct'
  | 'lumens-short'
  | 'lumens-over'
  | 'illuminance-short'
  | 'illuminance-over'
  | 'lpd-over'
  | 'metered-vs-rated'
  | 'watts-estimated'
  | 'circuit-overloaded'
  | 'low-power-factor'
  | 'more-watts';

export interface Warning {
  code: WarningCode;
  severity: Severity;
  /** A short heading. */
  title: string;
  /** What is wrong here, in plain words. */
  message: string;
  /** What to do about it. */
  action: string;
  /** True for wiring, heat and life-safety warnings. */
  safety: boolean;
  roomId?: string;
  entryId?: string;
  circuitLabel?: string;
}

/** The sentence every wiring, heat and life-safety warning ends with. */
export const safetyDeferral =
  'Follow local electrical and building codes, and have any wiring work done by a licensed electrician.';

/** Order of severities, most serious first. */
export const severityRank: Readonly<Record<Severity, number>> = { danger: 0, caution: 1, advice: 2 };

/** Thresholds the warnings use, with where each comes from. */
export const warningThresholds = {
  /** Metered watts this far off the rated figure are flagged — common practice, no published source. */
  meteredDeviationFraction: 0.1,
  /** CRI at or above this in colour-critical spaces (California Title 24 JA8 asks CRI ≥ 90). */
  colourCriticalMinCri: 90,
  /** CRI at or above this anywhere (ENERGY STAR Integral LED Lamps: CRI ≥ 80). */
  generalMinCri: 80,
  /** CCT spread within one room above this is flagged — common practice, no published source. */
  mixedCctKelvin: 300,
  /** Room illuminance this far under target is flagged — common practice, no published source. */
  illuminanceShortFraction: 0.8,
  /** Room illuminance this far over target is flagged — common practice, no published source. */
  illuminanceOverFraction: 1.5,
} as const;

/** Moisture ratings in order: a product suits a location of the same or a lower rank (dry < damp < wet, the UL 1598 location classes). */
export const moistureRank: Readonly<Record<MoistureRating, number>> = { dry: 0, damp: 1, wet: 2 };

/** The product ratings a rating rule reads. */
export type RatedProduct = Pick<ProposedProduct, 'form' | 'dimmable' | 'enclosedRated' | 'moistureRating' | 'insulationContactRated' | 'emergencyListed'>;

/**
 * The rating rules shared by these warnings, the automatic product choice
 * (`choice.ts`) and the screens' product fit: each is true when the product
 * does not suit the fixture's conditions. Every rule is "the fixture needs it
 * and the product lacks it".
 *
 * @example ratingRules.enclosed({ enclosed: true, … }, { enclosedRated: false, … }) //=> true
 */
export const ratingRules = {
  /** Any dimmer (phase-cut, 0-10 V or unknown) on the circuit needs a dimmable product. */
  dimmer: (c: Pick<FixtureConditions, 'dimmer'>, p: Pick<RatedProduct, 'dimmable'>): boolean => c.dimmer !== 'none' && !p.dimmable,
  enclosed: (c: Pick<FixtureConditions, 'enclosed'>, p: Pick<RatedProduct, 'enclosedRated'>): boolean => c.enclosed && !p.enclosedRated,
  moisture: (c: Pick<FixtureConditions, 'location'>, p: Pick<RatedProduct, 'moistureRating'>): boolean =>
    moistureRank[p.moistureRating] < moistureRank[c.location],
  emergency: (c: Pick<FixtureConditions, 'emergencyCircuit'>, p: Pick<RatedProduct, 'emergencyListed'>): boolean =>
    c.emergencyCircuit && !p.emergencyListed,
  /** A new luminaire touching insulation must be IC-rated (a lamp or kit inherits the existing housing). */
  insulationLuminaire: (c: Pick<FixtureConditions, 'insulationContact'>, p: Pick<RatedProduct, 'form' | 'insulationContactRated'>): boolean =>
    c.insulationContact && p.form === 'luminaire' && !p.insulationContactRated,
} as const;

/**
 * The least CRI a space needs: {@link warningThresholds}`.colourCriticalMinCri`
 * where colour rendering matters, `generalMinCri` elsewhere.
 *
 * @example minimumCri(true) //=> 90
 */
export function minimumCri(colourCritical: boolean): number {
  return colourCritical ? warningThresholds.colourCriticalMinCri : warningThresholds.generalMinCri;
}

/** Facts about one entry that the warning rules need, computed by the survey calculation. */
export interface EntryFacts {
  /** Proposed / existing delivered lumens per fixture, when both are known. */
  lumenRatio: number | null;
  lumenBand: { minRatio: number; maxRatio: number };
  /** Rated fixture watts (ignoring the meter) and the metered reading. */
  ratedFixtureWatts: number;
  meteredWattsPerFixture: number | null;
  wattsEstimated: boolean;
  existingWattsPerFixture: number;
  proposedWattsPerFixture: number | null;
  /** Power-factor rule the proposed product fails, if any. */
  powerFactorFailure: { minimum: number; rule: string } | null;
  hasMercury: boolean;
  pcbRisk: 'likely' | 'unknown' | 'none';
}

function make(
  code: WarningCode,
  severity: Severity,
  safety: boolean,
  title: string,
  message: string,
  action: string,
): Warning {
  return { code, severity, safety, title, message, action: safety ? `${action} ${safetyDeferral}` : action };
}

function pct(fraction: number): string {
  return `${Math.round(fraction * 100)} %`;
}

/**
 * The warnings for one fixture entry.
 *
 * @example entryWarnings(room, entryOnDimmerWithNonDimmableLamp, facts).map(w => w.code) //=> ['dimmer-non-dimmable']
 */
export function entryWarnings(room: Pick<Room, 'id' | 'colourCritical'>, entry: FixtureEntry, facts: EntryFacts): Warning[] {
  const out: Warning[] = [];
  const c = entry.conditions;
  const p = entry.proposed;

  if (p) {
    if (c.dimmer === '0-10v' && !p.dimmable) {
      out.push(
        make(
          'dimmer-non-dimmable',
          'advice',
          false,
          'Dimming control will be lost',
          `"${p.name}" is not dimmable, so the 0-10 V control on this circuit will no longer dim these fixtures.`,
          'Choose a product with a 0-10 V dimmable driver if the dimming is wanted.',
        ),
      );
    } else if (ratingRules.dimmer(c, p)) {
      out.push(
        make(
          'dimmer-non-dimmable',
          'caution',
          true,
          'Non-dimmable product on a dimmed circuit',
          `"${p.name}" is not dimmable but this circuit has a dimmer. It can flicker, buzz, fail early and overheat its driver, even with the dimmer at full.`,
          'Choose a dimmable product listed as compatible with this dimmer, or replace the dimmer with a switch.',
        ),
      );
    } else if (p.dimmable && (c.dimmer === 'leading-edge' || c.dimmer === 'unknown')) {
      out.push(
        make(
          'dimmer-compatibility',
          'advice',
          false,
          'Check the dimmer works with LED',
          `The dimmer on this circuit is ${c.dimmer === 'unknown' ? 'of an unknown kind' : 'a leading-edge (incandescent) type'}. LED loads are far smaller than the old lamps and may fall below the dimmer's minimum load, causing flicker or a poor dimming range.`,
          "Check the product maker's dimmer compatibility list and the dimmer's minimum load; an LED-rated (often trailing-edge) dimmer may be needed.",
        ),
      );
    }

    if (ratingRules.enclosed(c, p)) {
      out.push(
        make(
          'enclosed-not-rated',
          'caution',
          true,
          'Not rated for totally enclosed fixtures',
          `This fixture is totally enclosed, but "${p.name}" is not rated for enclosed use. Trapped heat shortens LED driver life sharply and can lead to early failure.`,
          'Choose a product marked as rated for totally enclosed luminaires, or replace the luminaire.',
        ),
      );
    }

    const needs = c.location;
    const has = p.moistureRating;
    if (ratingRules.moisture(c, p)) {
      out.push(
        make(
          'moisture-not-rated',
          needs === 'wet' ? 'danger' : 'caution',
          true,
          `Not rated for a ${needs} location`,
          `The fixture is in a ${needs} location but "${p.name}" is rated only for ${has} locations. Moisture in a lamp or driver not made for it is a shock and failure hazard.`,
          `Choose a product listed for ${needs} locations, used in a luminaire suitable for the location.`,
        ),
      );
    }

    if (ratingRules.emergency(c, p)) {
      out.push(
        make(
          'emergency-circuit',
          'danger',
          true,
          'Emergency or egress lighting',
          'This fixture is on an emergency or egress circuit. A product that does not work with its battery pack, inverter or transfer equipment can leave an escape route dark in an outage.',
          'Verify the product is listed for emergency use and compatible with the battery pack or inverter, then test the emergency function (duration and light level) after installation.',
        ),
      );
    }

    if (c.insulationContact && !(p.form === 'luminaire' && p.insulationContactRated)) {
      out.push(
        make(
          'insulation-contact',
          p.form === 'luminaire' ? 'danger' : 'caution',
          true,
          'Fixture in contact with insulation',
          p.form === 'luminaire'
            ? `The new luminaire "${p.name}" is not IC-rated but would sit in contact with thermal insulation: a fire hazard.`
            : 'The fixture sits in contact with thermal insulation; heat builds up around the lamp and driver and the existing housing may not be IC-rated.',
          'Use an IC-rated luminaire, or keep insulation clear of the housing as its listing requires.',
        ),
      );
    }

    if (p.tubeType === 'type-b' || p.tubeType === 'type-a-b') {
      out.push(
        make(
          'ballast-bypass',
          'caution',
          true,
          'Ballast bypass: the fixture is rewired',
          `"${p.name}" runs on line voltage at the lampholders${p.tubeType === 'type-a-b' ? ' when the ballast is removed' : ''}. Single-ended wiring needs non-shunted lampholders: a shunted holder would put line to neutral. The converted fixture must be labelled.`,
          'Have the conversion done by a qualified electrician, fit non-shunted lampholders where the wiring needs them, and apply the conversion label.',
        ),
      );
    } else if (p.tubeType === 'type-c' || (p.form === 'retrofit-kit' && entry.existing.ballast !== 'none')) {
      out.push(
        make(
          'fixture-rewired',
          'caution',
          true,
          'The fixture is rewired',
          p.tubeType === 'type-c'
            ? `"${p.name}" runs from a remote driver: the ballast comes out and the fixture is rewired to the driver.`
            : `Fitting the kit "${p.name}" removes the ballast and rewires the fixture; the converted fixture must carry the kit's conversion label.`,
          'Have the conversion done by a qualified electrician following the product\'s instructions, and apply the conversion label.',
        ),
      );
    } else if (p.tubeType === 'type-a') {
      out.push(
        make(
          'ballast-compatibility',
          entry.existing.ballast === 'magnetic' ? 'caution' : 'advice',
          false,
          'Tube runs on the existing ballast',
          entry.existing.ballast === 'magnetic'
            ? 'A Type A tube on a magnetic ballast is often not supported, and old ballasts fail soon after a retrofit.'
            : "A Type A tube depends on the existing ballast: it must be on the tube maker's compatibility list, and the light goes out when the ballast fails.",
          "Check the ballast model against the tube maker's compatibility list; consider Type B or C if the ballasts are old.",
        ),
      );
    }

    if (facts.lumenRatio !== null) {
      if (facts.lumenRatio < facts.lumenBand.minRatio) {
        out.push(
          make(
            'lumens-short',
            'caution',
            false,
            'Less light than now',
            `The proposal gives ${pct(facts.lumenRatio)} of the present light output per fixture (band ${pct(facts.lumenBand.minRatio)}–${pct(facts.lumenBand.maxRatio)}).`,
            'Choose a brighter product or more fixtures, unless the space is over-lit today (check the room illuminance).',
          ),
        );
      } else if (facts.lumenRatio > facts.lumenBand.maxRatio) {
        out.push(
          make(
            'lumens-over',
            'advice',
            false,
            'Much more light than now',
            `The proposal gives ${pct(facts.lumenRatio)} of the present light output per fixture; it may glare and wastes energy.`,
            'Consider a lower-output product.',
          ),
        );
      }
    }

    const cri = p.cri;
    if (room.colourCritical && cri < warningThresholds.colourCriticalMinCri) {
      out.push(
        make(
          'low-cri',
          'advice',
          false,
          'Low colour rendering for this space',
          `This space needs good colour rendering; "${p.name}" has CRI ${cri} (aim for ${warningThresholds.colourCriticalMinCri} or more).`,
          `Choose a product with CRI ≥ ${warningThresholds.colourCriticalMinCri}.`,
        ),
      );
    } else if (cri < warningThresholds.generalMinCri) {
      out.push(
        make(
          'low-cri',
          'advice',
          false,
          'Low colour rendering',
          `"${p.name}" has CRI ${cri}, below the usual minimum of ${warningThresholds.generalMinCri} for interior lighting.`,
          `Choose a product with CRI ≥ ${warningThresholds.generalMinCri}.`,
        ),
      );
    }

    if (facts.powerFactorFailure) {
      out.push(
        make(
          'low-power-factor',
          'advice',
          false,
          'Low power factor',
          `Power factor ${p.powerFactor} is below ${facts.powerFactorFailure.minimum} (${facts.powerFactorFailure.rule}). The product draws more current than its watts suggest, loading circuits and transformers.`,
          'Prefer a product with a higher power factor, especially where many are on one circuit.',
        ),
      );
    }

    if (facts.proposedWattsPerFixture !== null && facts.proposedWattsPerFixture > facts.existingWattsPerFixture) {
      out.push(
        make(
          'more-watts',
          'caution',
          false,
          'Proposal uses more power',
          `The proposal draws ${facts.proposedWattsPerFixture.toFixed(1)} W per fixture, more than the ${facts.existingWattsPerFixture.toFixed(1)} W it replaces.`,
          'Check the product and the number of units per fixture.',
        ),
      );
    }
  }

  if (facts.pcbRisk === 'likely') {
    out.push(
      make(
        'pcb-ballast',
        'danger',
        true,
        'Ballast may contain PCBs',
        `The ballast was made in ${entry.existing.ballastYear ?? 'or before 1979'}; ballasts made through 1979 may contain PCBs, and leaking ones are regulated hazardous waste.`,
        'Do not cut into or puncture the ballast; wear gloves; keep it intact and send it to a licensed hazardous-waste handler (US: TSCA, 40 CFR 761).',
      ),
    );
  } else if (facts.pcbRisk === 'unknown') {
    out.push(
      make(
        'pcb-ballast-unknown',
        'advice',
        true,
        'Check the ballast label for PCBs',
        'This magnetic ballast has no date recorded. Ballasts made through 1979 may contain PCBs; those without a "No PCBs" label should be treated as containing them.',
        'Read the ballast label before removal; handle unlabelled ballasts as PCB waste.',
      ),
    );
  }

  if (facts.hasMercury && p) {
    out.push(
      make(
        'mercury-lamps',
        'advice',
        false,
        'Lamps contain mercury',
        'The fluorescent or HID lamps removed here contain mercury.',
        'Do not break or landfill them; recycle them as universal waste (US: 40 CFR 273) or by your local rules.',
      ),
    );
  }

  if (facts.meteredWattsPerFixture !== null && facts.ratedFixtureWatts > 0) {
    const deviation = (facts.meteredWattsPerFixture - facts.ratedFixtureWatts) / facts.ratedFixtureWatts;
    if (Math.abs(deviation) > warningThresholds.meteredDeviationFraction) {
      out.push(
        make(
          'metered-vs-rated',
          'advice',
          false,
          'Metered watts differ from the rating',
          `Measured ${facts.meteredWattsPerFixture} W against a rated ${facts.ratedFixtureWatts.toFixed(1)} W (${deviation > 0 ? '+' : ''}${pct(deviation)}). The metered figure is used.`,
          'Check the lamp and ballast labels and re-measure; a large gap can mean a failing ballast, a wrong lamp or the wrong circuit.',
        ),
      );
    }
  } else if (facts.wattsEstimated) {
    out.push(
      make(
        'watts-estimated',
        'advice',
        false,
        'Fixture watts estimated',
        'No fixture input watts were given; they were estimated from the lamp watts and a typical ballast.',
        'Read the ballast label or meter one fixture for a firmer figure.',
      ),
    );
  }

  for (const w of out) {
    w.roomId = room.id;
    w.entryId = entry.id;
  }
  return out;
}

export interface RoomFacts {
  proposedCctsKelvin: number[];
  /** Proposed maintained illuminance and the target, when computable. */
  proposedLux: number | null;
  targetLux: number;
  proposedWattsPerSquareMetre: number;
  allowanceWattsPerSquareMetre: number;
  /** True when the room has at least one proposal. */
  hasProposal: boolean;
}

/**
 * The warnings for a room as a whole: mixed colour temperature, light level
 * against the target, and power density against the code allowance.
 *
 * Light levels and power densities in the messages are in the survey's units system.
 *
 * @example roomWarnings(room, { proposedCctsKelvin: [3000, 4000], … }, 'si').map(w => w.code) //=> ['mixed-cct']
 */
export function roomWarnings(room: Pick<Room, 'id' | 'name'>, facts: RoomFacts, units: UnitsSystem = 'si'): Warning[] {
  const out: Warning[] = [];
  const light = (lux: number) => `${Math.round(toDisplay('illuminance', lux, units))} ${displayUnits.illuminance[units]}`;
  const density = (wattsPerSquareMetre: number) =>
    `${toDisplay('powerDensity', wattsPerSquareMetre, units).toFixed(2)} ${displayUnits.powerDensity[units]}`;
  if (facts.proposedCctsKelvin.length > 1) {
    const min = Math.min(...facts.proposedCctsKelvin);
    const max = Math.max(...facts.proposedCctsKelvin);
    if (max - min > warningThresholds.mixedCctKelvin) {
      out.push(
        make(
          'mixed-cct',
          'advice',
          false,
          'Mixed colour temperatures',
          `Products from ${min} K to ${max} K are proposed in this room; the difference is visible.`,
          'Use one colour temperature per room unless the mix is intended.',
        ),
      );
    }
  }
  if (facts.hasProposal && facts.proposedLux !== null && facts.targetLux > 0) {
    const ratio = facts.proposedLux / facts.targetLux;
    if (ratio < warningThresholds.illuminanceShortFraction) {
      out.push(
        make(
          'illuminance-short',
          'caution',
          false,
          'Room below its recommended light level',
          `Estimated ${light(facts.proposedLux)} maintained against a target of ${light(facts.targetLux)} (${pct(ratio)}).`,
          'Add fixtures or choose brighter products; confirm with a photometric calculation for the final design.',
        ),
      );
    } else if (ratio > warningThresholds.illuminanceOverFraction) {
      out.push(
        make(
          'illuminance-over',
          'advice',
          false,
          'Room well above its recommended light level',
          `Estimated ${light(facts.proposedLux)} maintained against a target of ${light(facts.targetLux)} (${pct(ratio)}).`,
          'Consider lower-output products or fewer fixtures to save more.',
        ),
      );
    }
  }
  if (facts.hasProposal && facts.proposedWattsPerSquareMetre > facts.allowanceWattsPerSquareMetre) {
    out.push(
      make(
        'lpd-over',
        'caution',
        false,
        'Power density over the code allowance',
        `Proposed ${density(facts.proposedWattsPerSquareMetre)} against an allowance of ${density(facts.allowanceWattsPerSquareMetre)} (ASHRAE/IES 90.1-2019, space-by-space).`,
        'Lower the connected load, or check which energy code applies to this alteration.',
      ),
    );
  }
  for (const w of out) w.roomId = room.id;
  return out;
}

/**
 * The warning for a branch circuit loaded past 80 % of its breaker (NEC 210.20(A)).
 *
 * @example circuitWarning('B/14', 17.5, 20, 'proposed') //=> { code: 'circuit-overloaded', severity: 'danger', … }
 */
export function circuitWarning(circuitLabel: string, amps: number, breakerAmps: number, side: 'existing' | 'proposed'): Warning {
  const w = make(
    'circuit-overloaded',
    'danger',
    true,
    'Circuit over its continuous-load limit',
    `Circuit "${circuitLabel}" would carry ${amps.toFixed(1)} A (${side}), more than 80 % of its ${breakerAmps} A breaker; lighting is a continuous load.`,
    'Split the load across circuits or reduce it; do not upsize the breaker without checking the wire size.',
  );
  w.circuitLabel = circuitLabel;
  return w;
}
