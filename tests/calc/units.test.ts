import { createRequire } from 'node:module';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  feetToMetres,
  footcandlesToLux,
  formatMoney,
  fromDisplay,
  toDisplay,
  type DisplayQuantity,
  isKnownCurrency,
  luxToFootcandles,
  metresToFeet,
  parseDecimal,
  squareFeetToSquareMetres,
  squareMetresToSquareFeet,
  wattsPerSquareFootToWattsPerSquareMetre,
  wattsPerSquareMetreToWattsPerSquareFoot,
} from '../../src/calc/units.ts';

type Convert = (value: number) => { from(unit: string): { to(unit: string): number } };
// convert-units ships no type declarations; load it with a typed signature.
const convert: Convert = createRequire(import.meta.url)('convert-units');

/** convert-units derives the foot from the mile and rounds, so it agrees with the exact foot to about 3 parts in 10^8. */
const libraryTolerance = 1e-6;

function close(actual: number, expected: number, relative: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(relative * Math.max(1, Math.abs(expected)));
}

describe('exact definitions', () => {
  it('uses the international foot of exactly 0.3048 m', () => {
    // International yard and pound agreement (1959): 1 ft = 0.3048 m exactly.
    expect(feetToMetres(1)).toBe(0.3048);
    expect(squareFeetToSquareMetres(1)).toBeCloseTo(0.09290304, 12);
  });

  it('gives 1 fc = 10.7639 lux', () => {
    // 1 fc = 1 lm/ft² = 1/0.09290304 lm/m² = 10.763910417 lux (IES definition of the footcandle)
    expect(footcandlesToLux(1)).toBeCloseTo(10.763910417, 8);
    // REFERENCES: IES summary 50 fc office target = 538 lux
    expect(footcandlesToLux(50)).toBeCloseTo(538.1955, 3);
  });

  it('converts 90.1 LPD allowances from W/ft² to W/m² with the × 10.764 factor', () => {
    // ASHRAE/IES 90.1-2019 prints SI allowances as W/ft² × 10.764: office open plan 0.61 W/ft² ≈ 6.57 W/m²
    expect(wattsPerSquareFootToWattsPerSquareMetre(0.61)).toBeCloseTo(6.566, 3);
    expect(wattsPerSquareMetreToWattsPerSquareFoot(6.566)).toBeCloseTo(0.61, 3);
  });
});

describe('cross-check against the convert-units library', () => {
  it('agrees on length, area and illuminance over many random values', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e6, noNaN: true }), (x) => {
        close(feetToMetres(x), convert(x).from('ft').to('m'), libraryTolerance);
        close(metresToFeet(x), convert(x).from('m').to('ft'), libraryTolerance);
        close(squareFeetToSquareMetres(x), convert(x).from('ft2').to('m2'), libraryTolerance);
        close(squareMetresToSquareFeet(x), convert(x).from('m2').to('ft2'), libraryTolerance);
        close(footcandlesToLux(x), convert(x).from('ft-cd').to('lx'), libraryTolerance);
        close(luxToFootcandles(x), convert(x).from('lx').to('ft-cd'), libraryTolerance);
      }),
      { numRuns: 500 },
    );
  });

  it('round-trips without drift', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e7, noNaN: true }), (x) => {
        close(luxToFootcandles(footcandlesToLux(x)), x, 1e-12);
        close(squareMetresToSquareFeet(squareFeetToSquareMetres(x)), x, 1e-12);
      }),
    );
  });
});

describe('parseDecimal', () => {
  it('accepts a decimal point or a decimal comma', () => {
    // common practice, no published source: phone keypads in many locales type "," for decimals
    expect(parseDecimal('1.5', 'count')).toBe(1.5);
    expect(parseDecimal('1,5', 'count')).toBe(1.5);
    expect(parseDecimal(' 42 ', 'count')).toBe(42);
    expect(parseDecimal('-0,25', 'x')).toBe(-0.25);
    expect(parseDecimal('.5', 'x')).toBe(0.5);
  });

  it('refuses ambiguous or malformed text, naming the field', () => {
    expect(() => parseDecimal('', 'hoursPerYear')).toThrow(/hoursPerYear: is empty/);
    expect(() => parseDecimal('1,500.5', 'hoursPerYear')).toThrow(/hoursPerYear: "1,500.5" is not a number/);
    expect(() => parseDecimal('1e308', 'watts')).toThrow(/watts/);
    expect(() => parseDecimal('abc', 'watts')).toThrow(/watts/);
    expect(() => parseDecimal('NaN', 'watts')).toThrow(/watts/);
    expect(() => parseDecimal('Infinity', 'watts')).toThrow(/watts/);
  });
});

describe('money formatting through Intl', () => {
  it('formats by ISO 4217 code and locale', () => {
    // ECMA-402 Intl.NumberFormat with style "currency"
    expect(formatMoney(1234.5, 'USD', 'en-US')).toBe('$1,234.50');
    expect(formatMoney(1234.5, 'EUR', 'de-DE').replace(/\s/g, ' ')).toBe('1.234,50 €');
    expect(formatMoney(1234.5, 'GBP', 'en-GB', 0)).toBe('£1,235');
  });

  it('refuses an unknown currency code', () => {
    expect(isKnownCurrency('USD')).toBe(true);
    expect(isKnownCurrency('usd')).toBe(false);
    expect(isKnownCurrency('XQZ')).toBe(false);
    expect(() => formatMoney(1, 'DOLLARS', 'en-US')).toThrow(/currency/);
  });
});

describe('display in the survey units system', () => {
  it('shows imperial values and takes them back to SI exactly', () => {
    // exact foot (1959 agreement): 10 ft = 3.048 m; 1,000 ft² = 92.90304 m²; 50 fc = 538.196 lx
    expect(fromDisplay('length', 10, 'imperial')).toBeCloseTo(3.048, 12);
    expect(toDisplay('area', 92.90304, 'imperial')).toBeCloseTo(1000, 9);
    expect(fromDisplay('illuminance', 50, 'imperial')).toBeCloseTo(538.1955, 3);
    // ASHRAE/IES 90.1-2019 Table 9.6.1: corridor 0.41 W/ft² shown from its SI value
    expect(toDisplay('powerDensity', wattsPerSquareFootToWattsPerSquareMetre(0.41), 'imperial')).toBeCloseTo(0.41, 12);
  });

  it('passes SI values through and round-trips every quantity', () => {
    const quantities: DisplayQuantity[] = ['length', 'area', 'illuminance', 'powerDensity'];
    fc.assert(
      fc.property(fc.constantFrom(...quantities), fc.double({ min: 0, max: 1e6, noNaN: true }), (q, x) => {
        expect(toDisplay(q, x, 'si')).toBe(x);
        close(fromDisplay(q, toDisplay(q, x, 'imperial'), 'imperial'), x, 1e-12);
      }),
    );
  });
});
