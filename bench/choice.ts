/**
 * Automatic product choice speed: 10,000 synthetic entries × a generated
 * 200-product catalog (goal ≤ 1,000 ms median). Invented products.
 * Alone: `node bin/run-ts.mjs bench/choice.ts`.
 */
import { resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { chooseProducts } from '../src/calc/choice.ts';
import type { CatalogProduct, Distribution, MoistureRating, ProductForm, TubeType } from '../src/survey/model.ts';
import { seededRandom, syntheticSurvey } from './synthetic.ts';

/** A deterministic catalog of `size` invented products spread over every form, rating and output. */
export function syntheticCatalog(size: number, seed = 7): CatalogProduct[] {
  const rnd = seededRandom(seed);
  const pick = <T>(items: readonly T[]): T => items[Math.floor(rnd() * items.length)]!;
  const forms: ProductForm[] = ['screw-lamp', 'pin-lamp', 'linear-tube', 'luminaire', 'retrofit-kit'];
  const tubes: TubeType[] = ['type-a', 'type-b', 'type-c', 'type-a-b'];
  const moisture: MoistureRating[] = ['dry', 'damp', 'wet'];
  const distributions: Distribution[] = ['direct-narrow', 'direct-wide', 'semi-direct', 'diffuse', 'indirect'];
  const out: CatalogProduct[] = [];
  for (let i = 0; i < size; i++) {
    const form = forms[i % forms.length]!;
    const lumensPerUnit = form === 'linear-tube' ? 1500 + rnd() * 1200 : form === 'screw-lamp' || form === 'pin-lamp' ? 400 + rnd() * 1600 : 800 + rnd() * 30_000;
    const efficacy = 100 + rnd() * 80;
    const volts = rnd();
    out.push({
      id: `bench-${String(i).padStart(3, '0')}`,
      sku: `B-${i}`,
      name: `Bench product ${i}`,
      form,
      tubeType: form === 'linear-tube' ? pick(tubes) : 'not-a-tube',
      unitsPerFixture: form === 'linear-tube' ? 1 + Math.floor(rnd() * 4) : 1,
      wattsPerUnit: lumensPerUnit / efficacy,
      lumensPerUnit,
      cctKelvin: pick([2700, 3000, 3500, 4000, 5000]),
      cri: pick([70, 80, 82, 90, 95]),
      powerFactor: 0.9,
      ...(volts < 0.3 ? { inputVoltsMin: 120, inputVoltsMax: 277 } : volts < 0.5 ? { inputVoltsMin: 120, inputVoltsMax: 120 } : {}),
      dimmable: rnd() < 0.5,
      enclosedRated: rnd() < 0.6,
      moistureRating: pick(moisture),
      insulationContactRated: rnd() < 0.3,
      emergencyListed: rnd() < 0.1,
      ratedLifeHours: 15_000 + Math.floor(rnd() * 85_000),
      distribution: pick(distributions),
      unitCost: 2 + rnd() * (form === 'luminaire' ? 200 : 40),
      installMinutesPerFixture: 2 + Math.floor(rnd() * 40),
      rebatePerFixture: Math.floor(rnd() * 20),
      example: false,
      retired: rnd() < 0.05,
    });
  }
  return out;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

export function choiceBench(): { entries: number; products: number; medianMs: number; goalMs: number; withChoice: number; changed: number } {
  const entries = 10_000;
  const survey = syntheticSurvey(entries, 10, 42);
  const catalog = syntheticCatalog(200);
  let last = chooseProducts(survey, catalog);
  for (let i = 0; i < 2; i++) last = chooseProducts(survey, catalog);
  const times: number[] = [];
  for (let i = 0; i < 7; i++) {
    const t0 = performance.now();
    last = chooseProducts(survey, catalog);
    times.push(performance.now() - t0);
  }
  return {
    entries,
    products: catalog.length,
    medianMs: Math.round(median(times) * 1000) / 1000,
    goalMs: 1000,
    withChoice: last.counts.withChoice,
    changed: last.counts.changed,
  };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  process.stdout.write(`${JSON.stringify({ choice: choiceBench() }, null, 2)}\n`);
}
