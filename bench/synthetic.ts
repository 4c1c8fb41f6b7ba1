/**
 * A deterministic synthetic survey of any size, for the benchmark and for
 * large-survey tests. Invented data: rooms cycle through space types and the
 * example catalog, with a mix of conditions that trigger warnings.
 */
import { exampleCatalog, proposalFromCatalog } from '../src/survey/examples.ts';
import { demoSurvey } from '../src/survey/demo.ts';
import type { ExistingTechnology, FixtureEntry, Room, SpaceType, Survey } from '../src/survey/model.ts';

/** Small seeded generator (mulberry32) so every run sees the same survey. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const spaces: SpaceType[] = ['office-open', 'office-enclosed', 'corridor', 'restroom', 'storage', 'retail-sales', 'classroom', 'dwelling-unit'];
const existingKinds: { technology: ExistingTechnology; lamps: number; watts: number; ballast: 'none' | 'electronic' | 'magnetic'; lumens?: number }[] = [
  { technology: 'linear-t8', lamps: 4, watts: 32, ballast: 'electronic', lumens: 2800 },
  { technology: 'linear-t12', lamps: 2, watts: 40, ballast: 'magnetic', lumens: 2650 },
  { technology: 'incandescent', lamps: 1, watts: 60, ballast: 'none' },
  { technology: 'cfl-pin', lamps: 1, watts: 26, ballast: 'electronic', lumens: 1710 },
  { technology: 'metal-halide', lamps: 1, watts: 400, ballast: 'magnetic', lumens: 36000 },
];

/** Builds a survey with `entryCount` entries, `entriesPerRoom` to a room. */
export function syntheticSurvey(entryCount: number, entriesPerRoom = 10, seed = 1): Survey {
  const rnd = seededRandom(seed);
  const pick = <T>(items: readonly T[]): T => items[Math.floor(rnd() * items.length)]!;
  const base = demoSurvey();
  const rooms: Room[] = [];
  let made = 0;
  let circuit = 0;
  while (made < entryCount) {
    const r = rooms.length;
    const entries: FixtureEntry[] = [];
    for (let i = 0; i < entriesPerRoom && made < entryCount; i++, made++) {
      const kind = pick(existingKinds);
      const product = pick(exampleCatalog);
      const withCircuit = rnd() < 0.3;
      entries.push({
        id: `s-${r}-${i}`,
        count: 1 + Math.floor(rnd() * 20),
        existing: {
          technology: kind.technology,
          description: `${kind.lamps}-lamp ${kind.technology}`,
          lampsPerFixture: kind.lamps,
          ratedWattsPerLamp: kind.watts,
          ballast: kind.ballast,
          ...(kind.lumens !== undefined ? { lumensPerLamp: kind.lumens } : {}),
          ...(rnd() < 0.2 ? { meteredWattsPerFixture: kind.lamps * kind.watts * (0.8 + rnd() * 0.4) } : {}),
          ...(kind.ballast === 'magnetic' ? { ballastYear: 1970 + Math.floor(rnd() * 30) } : {}),
          lampPrice: 2 + rnd() * 8,
        },
        conditions: {
          enclosed: rnd() < 0.1,
          dimmer: rnd() < 0.1 ? 'leading-edge' : 'none',
          location: rnd() < 0.1 ? 'damp' : 'dry',
          emergencyCircuit: rnd() < 0.05,
          insulationContact: rnd() < 0.05,
          circuitVolts: 120,
          ...(withCircuit ? { circuitLabel: `P${Math.floor(circuit++ / 6)}`, breakerAmps: 20 } : {}),
        },
        proposed: rnd() < 0.95 ? proposalFromCatalog(product) : null,
        control: rnd() < 0.2 ? 'occupancy-sensor' : 'none',
        notes: '',
      });
    }
    rooms.push({
      id: `s-room-${r}`,
      name: `Room ${r + 1}`,
      spaceType: pick(spaces),
      floor: { kind: 'rectangle', lengthMetres: 4 + rnd() * 20, widthMetres: 3 + rnd() * 15 },
      ceilingHeightMetres: 2.7 + rnd() * 2,
      workPlaneHeightMetres: 0.76,
      hours: rnd() < 0.5 ? { kind: 'annual', hoursPerYear: 1000 + Math.floor(rnd() * 7000) } : { kind: 'weekly', days: [10, 10, 10, 10, 10, 4, 0] },
      colourCritical: rnd() < 0.1,
      photometry: {},
      entries,
      notes: '',
    });
  }
  return { ...base, id: `synthetic-${entryCount}`, name: `Synthetic survey (${entryCount} entries)`, rooms };
}
