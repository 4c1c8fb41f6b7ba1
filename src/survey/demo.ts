/**
 * The demo survey: an invented three-storey building with a corner shop on
 * the ground floor, two flats above, a shared stair and a basement store.
 * Every name, address and price here is made up. It is built to show real
 * numbers and real warnings at once: a dimmed circuit with a non-dimmable
 * lamp, enclosed and damp fixtures, an emergency stair light, an old
 * magnetic-ballast fluorescent basement and a metered fixture.
 */
import { exampleCatalog, proposalFromCatalog } from './examples.ts';
import type { CatalogProduct, ExistingEquipment, FixtureConditions, FixtureEntry, ProposedProduct, Survey } from './model.ts';

function product(id: string): CatalogProduct {
  const found = exampleCatalog.find((p) => p.id === id);
  if (!found) throw new Error(`demo: no example product "${id}"`);
  return found;
}

/** A custom spec typed on site, starting from a catalog product's fields (no catalog link). */
function customFrom(id: string): ProposedProduct {
  const { catalogId: _link, ...spec } = proposalFromCatalog(product(id));
  return spec;
}

const dry120: FixtureConditions = {
  enclosed: false,
  dimmer: 'none',
  location: 'dry',
  emergencyCircuit: false,
  insulationContact: false,
  circuitVolts: 120,
};

function existing(partial: Partial<ExistingEquipment> & Pick<ExistingEquipment, 'technology' | 'description' | 'ratedWattsPerLamp'>): ExistingEquipment {
  return { lampsPerFixture: 1, ballast: 'none', ...partial };
}

function entry(id: string, fields: Omit<FixtureEntry, 'id' | 'notes' | 'control'> & Partial<Pick<FixtureEntry, 'notes' | 'control'>>): FixtureEntry {
  return { id, control: 'none', notes: '', ...fields };
}

const stamp = '2026-11-18T09:30:00.000Z';

/** Builds a fresh copy of the demo survey. */
export function demoSurvey(): Survey {
  return {
    id: 'demo-tallowmere',
    name: 'Tallowmere Corner — shop and flats (demo)',
    site: { name: 'Tallowmere Corner', address: '7 Wicklight Row, Fernhollow (invented address)' },
    client: { name: 'Fernhollow Housing Cooperative (invented)', contact: 'Site manager' },
    preparedBy: 'Demo auditor',
    buildingType: 'multifamily',
    heatingType: 'fossil',
    cooled: true,
    units: 'imperial',
    locale: 'en-US',
    money: {
      currency: 'USD',
      energyRatePerKwh: 0.16,
      demandChargePerKwMonth: 9.5,
      energyEscalationPerYear: 0.01,
      discountRatePerYear: 0.03,
      analysisYears: 15,
      labourRatePerHour: 68,
      markupFraction: 0.15,
      taxFraction: 0.07,
      taxBase: 'materials',
      lampRecyclingCostEach: 0.9,
      ballastDisposalCostEach: 2.5,
      relampMinutes: 10,
    },
    savings: {},
    grid: { kind: 'egrid', subregion: 'RFCE' },
    notes: 'Walked on a weekday morning; the shop owner reports lights on 7am–9pm every day.',
    createdAt: stamp,
    updatedAt: stamp,
    rooms: [
      {
        id: 'demo-shop',
        name: 'Shop floor',
        spaceType: 'retail-sales',
        floor: { kind: 'rectangle', lengthMetres: 12.2, widthMetres: 7.3 },
        ceilingHeightMetres: 3.0,
        workPlaneHeightMetres: 0.76,
        hours: { kind: 'weekly', days: [14, 14, 14, 14, 14, 14, 12] },
        colourCritical: false,
        photometry: {},
        notes: 'Lay-in ceiling, 2×4 troffers.',
        entries: [
          entry('demo-shop-troffers', {
            count: 12,
            existing: existing({
              technology: 'linear-t8',
              description: '2×4 troffer, 4-lamp F32T8',
              lampsPerFixture: 4,
              ratedWattsPerLamp: 32,
              lumensPerLamp: 2800,
              ballast: 'electronic',
              meteredWattsPerFixture: 118,
              cctKelvin: 4100,
              cri: 78,
              lampPrice: 3.2,
            }),
            conditions: { ...dry120, circuitLabel: 'Panel A / 3', breakerAmps: 20 },
            proposed: proposalFromCatalog(product('example-troffer-kit')),
            control: 'none',
          }),
          entry('demo-shop-display', {
            count: 8,
            existing: existing({ technology: 'halogen', description: 'Track head, halogen PAR38 90 W', ratedWattsPerLamp: 90, lampPrice: 7 }),
            conditions: { ...dry120, circuitLabel: 'Panel A / 5', breakerAmps: 15 },
            proposed: {
              ...customFrom('example-downlight-ic'),
              name: 'PAR38 LED 14 W 1,250 lm 3000 K (custom spec)',
              form: 'screw-lamp',
              wattsPerUnit: 14,
              lumensPerUnit: 1250,
              unitCost: 11,
              installMinutesPerFixture: 3,
              rebatePerFixture: 2,
              insulationContactRated: false,
              moistureRating: 'damp',
            },
          }),
        ],
      },
      {
        id: 'demo-stair',
        name: 'Common stair and landings',
        spaceType: 'stairwell',
        floor: { kind: 'area', squareMetres: 28 },
        ceilingHeightMetres: 2.7,
        workPlaneHeightMetres: 0,
        hours: { kind: 'annual', hoursPerYear: 8760 },
        colourCritical: false,
        photometry: {},
        notes: 'Lit around the clock. Landing fixtures are on the emergency circuit.',
        entries: [
          entry('demo-stair-bulkheads', {
            count: 6,
            existing: existing({
              technology: 'cfl-pin',
              description: 'Enclosed bulkhead, 26 W CFL',
              ratedWattsPerLamp: 26,
              lumensPerLamp: 1710,
              ballast: 'electronic',
              lampPrice: 4.5,
            }),
            conditions: { ...dry120, enclosed: true, emergencyCircuit: true, circuitLabel: 'Panel A / 9 (emergency)', breakerAmps: 15 },
            proposed: {
              ...customFrom('example-vapourtight'),
              name: 'Bulkhead LED 12 W 1,300 lm 4000 K',
              wattsPerUnit: 12,
              lumensPerUnit: 1300,
              unitCost: 29,
              installMinutesPerFixture: 30,
              rebatePerFixture: 8,
              moistureRating: 'damp',
            },
            control: 'occupancy-sensor',
          }),
        ],
      },
      {
        id: 'demo-flat1-living',
        name: 'Flat 1 — living room',
        spaceType: 'dwelling-unit',
        floor: { kind: 'rectangle', lengthMetres: 5.2, widthMetres: 4.1 },
        ceilingHeightMetres: 2.5,
        workPlaneHeightMetres: 0.76,
        hours: { kind: 'weekly', days: [5, 5, 5, 5, 6, 7, 7] },
        colourCritical: false,
        photometry: {},
        notes: 'Ceiling fittings on a rotary dimmer by the door.',
        entries: [
          entry('demo-flat1-pendants', {
            count: 3,
            existing: existing({ technology: 'incandescent', description: 'Pendant, 60 W A-lamp', ratedWattsPerLamp: 60, lampPrice: 1.2 }),
            conditions: { ...dry120, dimmer: 'leading-edge' },
            proposed: proposalFromCatalog(product('example-a19-basic')),
          }),
        ],
      },
      {
        id: 'demo-flat1-bath',
        name: 'Flat 1 — bathroom',
        spaceType: 'dwelling-unit',
        floor: { kind: 'rectangle', lengthMetres: 2.6, widthMetres: 2.0 },
        ceilingHeightMetres: 2.4,
        workPlaneHeightMetres: 0.76,
        hours: { kind: 'annual', hoursPerYear: 900 },
        colourCritical: false,
        photometry: {},
        notes: 'Sealed glass ceiling fitting over the shower.',
        entries: [
          entry('demo-flat1-bath-ceiling', {
            count: 1,
            existing: existing({
              technology: 'incandescent',
              description: 'Enclosed glass ceiling fitting, 2 × 60 W',
              lampsPerFixture: 2,
              ratedWattsPerLamp: 60,
              lampPrice: 1.2,
            }),
            conditions: { ...dry120, enclosed: true, location: 'wet' },
            proposed: { ...proposalFromCatalog(product('example-a19-basic')), unitsPerFixture: 2 },
          }),
        ],
      },
      {
        id: 'demo-flat2-kitchen',
        name: 'Flat 2 — kitchen',
        spaceType: 'dwelling-unit',
        floor: { kind: 'rectangle', lengthMetres: 3.4, widthMetres: 2.9 },
        ceilingHeightMetres: 2.5,
        workPlaneHeightMetres: 0.9,
        hours: { kind: 'annual', hoursPerYear: 1600 },
        colourCritical: false,
        photometry: {},
        notes: 'Recessed cans under a loft with blown insulation.',
        entries: [
          entry('demo-flat2-cans', {
            count: 4,
            existing: existing({ technology: 'incandescent', description: 'Recessed can, 75 W BR30', ratedWattsPerLamp: 75, lumensPerLamp: 850, lampPrice: 4 }),
            conditions: { ...dry120, insulationContact: true, dimmer: 'trailing-edge' },
            proposed: proposalFromCatalog(product('example-downlight-ic')),
          }),
        ],
      },
      {
        id: 'demo-basement',
        name: 'Basement store',
        spaceType: 'storage',
        floor: { kind: 'rectangle', lengthMetres: 9.0, widthMetres: 6.0 },
        ceilingHeightMetres: 2.6,
        workPlaneHeightMetres: 0,
        hours: { kind: 'annual', hoursPerYear: 2500 },
        colourCritical: false,
        photometry: {},
        notes: 'Damp walls. Old strip fittings; one ballast label reads 1978.',
        entries: [
          entry('demo-basement-strips', {
            count: 6,
            existing: existing({
              technology: 'linear-t12',
              description: 'Open strip, 2-lamp F40T12, magnetic ballast',
              lampsPerFixture: 2,
              ratedWattsPerLamp: 40,
              lumensPerLamp: 2650,
              ballast: 'magnetic',
              fixtureInputWatts: 94,
              ballastYear: 1978,
              lampPrice: 3,
            }),
            conditions: { ...dry120, location: 'damp', circuitLabel: 'Panel B / 2', breakerAmps: 15 },
            proposed: proposalFromCatalog(product('example-t8-typeb')),
          }),
        ],
      },
    ],
  };
}
