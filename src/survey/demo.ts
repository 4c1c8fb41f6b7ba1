/**
 * The demo survey: an invented three-storey building with a corner shop on
 * the ground floor, two flats above, a shared stair and a basement store.
 * Every name, address and price here is made up. It is built to show real
 * numbers and real warnings at once: a dimmed circuit with a non-dimmable
 * lamp, enclosed and damp fixtures, an emergency stair light, an old
 * magnetic-ballast fluorescent basement and a metered fixture.
 */
import { exampleCatalog, proposalFromCatalog } from './examples.ts';
import type { CatalogProduct, ExistingEquipment, FixtureConditions, FixtureEntry, Portfolio, ProposedProduct, Survey } from './model.ts';

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

// ---------------------------------------------------------------------------
// The landlord scenario: the same invented housing cooperative owns two more
// buildings, surveyed as repeated layouts (one typical unit standing for
// many), and plans the swap across all of them under a yearly budget.

/** When the layouts were walked (a week before the corner building). */
const layoutStamp = '2026-11-11T10:00:00.000Z';

/** Client of every demo survey and of the demo portfolio. */
const demoClient = { name: 'Fernhollow Housing Cooperative (invented)', contact: 'Asset manager' };

/** Money assumptions shared by the cooperative's surveys: the corner building's (one currency, one plan). */
function demoMoney(): Survey['money'] {
  return { ...demoSurvey().money };
}

/** A survey of one layout with the cooperative's defaults. */
function layoutSurvey(fields: Pick<Survey, 'id' | 'name' | 'site' | 'notes' | 'rooms'> & Partial<Pick<Survey, 'layout'>>): Survey {
  return {
    client: { ...demoClient },
    preparedBy: 'Demo auditor',
    buildingType: 'multifamily',
    heatingType: 'fossil',
    cooled: false,
    units: 'imperial',
    locale: 'en-US',
    money: demoMoney(),
    savings: {},
    grid: { kind: 'egrid', subregion: 'RFCE' },
    createdAt: layoutStamp,
    updatedAt: layoutStamp,
    ...fields,
  };
}

/** Ids of the fixture entries of the one-bedroom flat layout (the differing units name them). */
export const demoFlatEntryIds = {
  hall: 'demo-wf-hall-ceiling',
  kitchen: 'demo-wf-kitchen-cans',
  bathroom: 'demo-wf-bath-ceiling',
  living: 'demo-wf-living-pendants',
  bedroom: 'demo-wf-bedroom-pendant',
} as const;

/**
 * The typical one-bedroom flat of Wrenfold Court: 24 flats of one layout.
 * Flat 7 was converted by its tenant already (every count 0); flat 19 has a
 * second bedroom pendant.
 */
function wrenfoldFlat(): Survey {
  const ids = demoFlatEntryIds;
  return layoutSurvey({
    id: 'demo-wrenfold-flat',
    name: 'Wrenfold Court — one-bedroom flat, typical (demo)',
    site: { name: 'Wrenfold Court', address: '2–48 Quillby Lane, Fernhollow (invented address)' },
    notes: 'Flat 12 walked as the typical unit with the caretaker; the others were checked from the door. Lamps are tenant-replaced as they fail.',
    layout: {
      unitCount: 24,
      exceptions: [
        {
          id: 'demo-wf-flat-7',
          unitLabel: 'Flat 7',
          entryCounts: Object.values(ids).map((entryId) => ({ entryId, count: 0 })),
          notes: 'Tenant fitted LED lamps throughout last year: nothing to change.',
        },
        {
          id: 'demo-wf-flat-19',
          unitLabel: 'Flat 19',
          entryCounts: [{ entryId: ids.bedroom, count: 2 }],
          notes: 'A second ceiling pendant over the bed.',
        },
      ],
    },
    rooms: [
      {
        id: 'demo-wf-hall',
        name: 'Hall',
        spaceType: 'dwelling-unit',
        floor: { kind: 'rectangle', lengthMetres: 3.2, widthMetres: 1.1 },
        ceilingHeightMetres: 2.4,
        workPlaneHeightMetres: 0,
        hours: { kind: 'annual', hoursPerYear: 1000 },
        colourCritical: false,
        photometry: {},
        notes: '',
        entries: [
          entry(ids.hall, {
            count: 1,
            existing: existing({ technology: 'incandescent', description: 'Flush glass ceiling fitting, 60 W A-lamp', ratedWattsPerLamp: 60, lampPrice: 1.2 }),
            conditions: { ...dry120, enclosed: true },
            proposed: proposalFromCatalog(product('example-a19-dim-enclosed')),
          }),
        ],
      },
      {
        id: 'demo-wf-kitchen',
        name: 'Kitchen',
        spaceType: 'dwelling-unit',
        floor: { kind: 'rectangle', lengthMetres: 3.0, widthMetres: 2.4 },
        ceilingHeightMetres: 2.4,
        workPlaneHeightMetres: 0.9,
        hours: { kind: 'annual', hoursPerYear: 1500 },
        colourCritical: false,
        photometry: {},
        notes: 'Recessed cans in a plasterboard ceiling; the flat above, no insulation.',
        entries: [
          entry(ids.kitchen, {
            count: 3,
            existing: existing({ technology: 'incandescent', description: 'Recessed can, 65 W BR30', ratedWattsPerLamp: 65, lumensPerLamp: 650, lampPrice: 4 }),
            conditions: { ...dry120 },
            proposed: proposalFromCatalog(product('example-downlight-ic')),
          }),
        ],
      },
      {
        id: 'demo-wf-bath',
        name: 'Bathroom',
        spaceType: 'dwelling-unit',
        floor: { kind: 'rectangle', lengthMetres: 2.2, widthMetres: 1.8 },
        ceilingHeightMetres: 2.4,
        workPlaneHeightMetres: 0.76,
        hours: { kind: 'annual', hoursPerYear: 700 },
        colourCritical: false,
        photometry: {},
        notes: 'No extract fan; condensation on the ceiling.',
        entries: [
          entry(ids.bathroom, {
            count: 1,
            existing: existing({
              technology: 'incandescent',
              description: 'Enclosed glass ceiling fitting, 2 × 40 W',
              lampsPerFixture: 2,
              ratedWattsPerLamp: 40,
              lampPrice: 1.2,
            }),
            conditions: { ...dry120, enclosed: true, location: 'damp' },
            proposed: { ...proposalFromCatalog(product('example-a19-dim-enclosed')), unitsPerFixture: 2 },
          }),
        ],
      },
      {
        id: 'demo-wf-living',
        name: 'Living room',
        spaceType: 'dwelling-unit',
        floor: { kind: 'rectangle', lengthMetres: 4.6, widthMetres: 3.6 },
        ceilingHeightMetres: 2.4,
        workPlaneHeightMetres: 0.76,
        hours: { kind: 'weekly', days: [5, 5, 5, 5, 6, 7, 7] },
        colourCritical: false,
        photometry: {},
        notes: 'Two pendants on a rotary dimmer by the door.',
        entries: [
          entry(ids.living, {
            count: 2,
            existing: existing({ technology: 'incandescent', description: 'Pendant, 75 W A-lamp', ratedWattsPerLamp: 75, lampPrice: 1.3 }),
            conditions: { ...dry120, dimmer: 'leading-edge' },
            proposed: proposalFromCatalog(product('example-a19-dim-enclosed')),
          }),
        ],
      },
      {
        id: 'demo-wf-bedroom',
        name: 'Bedroom',
        spaceType: 'dwelling-unit',
        floor: { kind: 'rectangle', lengthMetres: 3.6, widthMetres: 3.2 },
        ceilingHeightMetres: 2.4,
        workPlaneHeightMetres: 0.76,
        hours: { kind: 'annual', hoursPerYear: 600 },
        colourCritical: false,
        photometry: {},
        notes: '',
        entries: [
          entry(ids.bedroom, {
            count: 1,
            existing: existing({ technology: 'incandescent', description: 'Pendant, 60 W A-lamp', ratedWattsPerLamp: 60, lampPrice: 1.2 }),
            conditions: { ...dry120 },
            proposed: proposalFromCatalog(product('example-a19-basic')),
          }),
        ],
      },
    ],
  });
}

/** Wrenfold Court's common parts: two identical stair cores, each with its corridors. */
function wrenfoldCommon(): Survey {
  return layoutSurvey({
    id: 'demo-wrenfold-common',
    name: 'Wrenfold Court — stair core and corridors (demo)',
    site: { name: 'Wrenfold Court', address: '2–48 Quillby Lane, Fernhollow (invented address)' },
    notes: 'Stair A walked; stair B is built and lit the same way. Lit around the clock.',
    layout: { unitCount: 2, exceptions: [] },
    rooms: [
      {
        id: 'demo-wfc-corridors',
        name: 'Corridors, floors 1–4',
        spaceType: 'corridor',
        floor: { kind: 'area', squareMetres: 96 },
        ceilingHeightMetres: 2.6,
        workPlaneHeightMetres: 0,
        hours: { kind: 'annual', hoursPerYear: 8760 },
        colourCritical: false,
        photometry: {},
        notes: 'Surface wraparounds, two per floor.',
        entries: [
          entry('demo-wfc-wraps', {
            count: 8,
            existing: existing({
              technology: 'linear-t8',
              description: 'Surface wraparound, 2-lamp F32T8',
              lampsPerFixture: 2,
              ratedWattsPerLamp: 32,
              lumensPerLamp: 2800,
              ballast: 'electronic',
              lampPrice: 3.2,
            }),
            conditions: { ...dry120, circuitLabel: 'Landlord panel / 4', breakerAmps: 15 },
            proposed: proposalFromCatalog(product('example-t8-typea')),
            control: 'occupancy-sensor',
          }),
        ],
      },
      {
        id: 'demo-wfc-stair',
        name: 'Stair and landings',
        spaceType: 'stairwell',
        floor: { kind: 'area', squareMetres: 40 },
        ceilingHeightMetres: 2.7,
        workPlaneHeightMetres: 0,
        hours: { kind: 'annual', hoursPerYear: 8760 },
        colourCritical: false,
        photometry: {},
        notes: 'Landing bulkheads are on the emergency circuit, with battery packs.',
        entries: [
          entry('demo-wfc-bulkheads', {
            count: 5,
            existing: existing({
              technology: 'cfl-pin',
              description: 'Enclosed bulkhead, 26 W CFL, emergency pack',
              ratedWattsPerLamp: 26,
              lumensPerLamp: 1710,
              ballast: 'electronic',
              lampPrice: 4.5,
            }),
            conditions: { ...dry120, enclosed: true, emergencyCircuit: true, circuitLabel: 'Landlord panel / 6 (emergency)', breakerAmps: 15 },
            proposed: {
              ...customFrom('example-vapourtight'),
              name: 'Bulkhead LED 12 W 1,300 lm 4000 K, integral emergency driver',
              wattsPerUnit: 12,
              lumensPerUnit: 1300,
              unitCost: 74,
              installMinutesPerFixture: 40,
              rebatePerFixture: 8,
              moistureRating: 'damp',
              emergencyListed: true,
            },
          }),
        ],
      },
    ],
  });
}

/** Harrowgate Terrace: eight studio flats of one layout, none differing. */
function harrowgateStudio(): Survey {
  return layoutSurvey({
    id: 'demo-harrowgate-studio',
    name: 'Harrowgate Terrace — studio flat, typical (demo)',
    site: { name: 'Harrowgate Terrace', address: '1–8 Mossbrook Yard, Fernhollow (invented address)' },
    notes: 'Studio 3 walked as the typical unit.',
    layout: { unitCount: 8, exceptions: [] },
    rooms: [
      {
        id: 'demo-hg-main',
        name: 'Main room and kitchenette',
        spaceType: 'dwelling-unit',
        floor: { kind: 'rectangle', lengthMetres: 5.4, widthMetres: 3.8 },
        ceilingHeightMetres: 2.5,
        workPlaneHeightMetres: 0.76,
        hours: { kind: 'annual', hoursPerYear: 2000 },
        colourCritical: false,
        photometry: {},
        notes: 'Fluorescent batten over the kitchenette, a pendant in the room.',
        entries: [
          entry('demo-hg-batten', {
            count: 1,
            existing: existing({
              technology: 'linear-t12',
              description: 'Batten, 1-lamp F40T12, magnetic ballast',
              ratedWattsPerLamp: 40,
              lumensPerLamp: 2650,
              ballast: 'magnetic',
              fixtureInputWatts: 50,
              lampPrice: 3,
            }),
            conditions: { ...dry120 },
            proposed: proposalFromCatalog(product('example-t8-typeb')),
          }),
          entry('demo-hg-pendant', {
            count: 1,
            existing: existing({ technology: 'cfl-screw', description: 'Pendant, 20 W spiral CFL', ratedWattsPerLamp: 20, lumensPerLamp: 1200, ballast: 'electronic', lampPrice: 3 }),
            conditions: { ...dry120 },
            proposed: proposalFromCatalog(product('example-a19-basic')),
          }),
        ],
      },
      {
        id: 'demo-hg-shower',
        name: 'Shower room',
        spaceType: 'dwelling-unit',
        floor: { kind: 'rectangle', lengthMetres: 2.0, widthMetres: 1.6 },
        ceilingHeightMetres: 2.4,
        workPlaneHeightMetres: 0.76,
        hours: { kind: 'annual', hoursPerYear: 700 },
        colourCritical: false,
        photometry: {},
        notes: '',
        entries: [
          entry('demo-hg-shower-ceiling', {
            count: 1,
            existing: existing({ technology: 'incandescent', description: 'Enclosed glass ceiling fitting, 60 W', ratedWattsPerLamp: 60, lampPrice: 1.2 }),
            conditions: { ...dry120, enclosed: true, location: 'damp' },
            proposed: proposalFromCatalog(product('example-a19-dim-enclosed')),
          }),
        ],
      },
    ],
  });
}

/**
 * Fresh copies of the landlord scenario's layout surveys: Wrenfold Court's
 * one-bedroom flat (24 flats, two differing), its stair cores (2) and
 * Harrowgate Terrace's studio flat (8).
 */
export function demoLandlordSurveys(): Survey[] {
  return [wrenfoldFlat(), wrenfoldCommon(), harrowgateStudio()];
}

/**
 * The demo portfolio: the cooperative's three buildings (the corner building
 * and the layouts above), planned over three years under a yearly budget
 * smaller than the whole swap, so the plan defers some measures.
 */
export function demoPortfolio(): Portfolio {
  return {
    id: 'demo-fernhollow-estate',
    name: 'Fernhollow estate — LED swap (demo)',
    client: { ...demoClient },
    surveyIds: [demoSurvey().id, ...demoLandlordSurveys().map((survey) => survey.id)],
    plan: { budgetPerYear: 2500, years: 3 },
    notes: 'Invented example: three buildings of one landlord, the work spread over three years.',
    createdAt: layoutStamp,
    updatedAt: layoutStamp,
  };
}
