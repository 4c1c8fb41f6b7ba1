import { jsPDF } from 'jspdf';
import { describe, expect, it } from 'vitest';
import { figuresFor } from '../../src/export/figures.ts';
import { isWinAnsi, pdfSafeText } from '../../src/export/text.ts';
import { compact, pdfText } from './pdf-helpers.ts';

describe('pdfSafeText', () => {
  it('keeps the characters WinAnsi holds', () => {
    // Windows code page 1252 (the PDF WinAnsiEncoding): Latin-1 plus € – — ‘ ’ “ ” • … ™ in 0x80–0x9F.
    for (const text of ['25 °C', '12 m²', '1.234,50 €', '3–4 years', '10 µF', '2 × 4', '± 5 %', 'café, Müller, ½', '“quoted” — ‘single’ • … ™']) {
      expect(pdfSafeText(text)).toBe(text);
    }
  });

  it('turns Greek mu into the micro sign and spells out Ω, ≥ and ≤', () => {
    expect(pdfSafeText('10 \u03bcF')).toBe('10 \u00b5F');
    expect(pdfSafeText('5 Ω and 5 \u2126')).toBe('5 ohm and 5 ohm');
    expect(pdfSafeText('CRI ≥ 90, PF ≤ 1')).toBe('CRI >= 90, PF <= 1');
  });

  it('replaces other characters sensibly', () => {
    expect(pdfSafeText('\u22125 W')).toBe('-5 W'); // minus sign
    expect(pdfSafeText('CO\u2082')).toBe('CO2'); // subscript two
    expect(pdfSafeText('\ufb01xture')).toBe('fixture'); // fi ligature
    expect(pdfSafeText('Łódź, Kraków')).toBe('Lódz, Kraków'); // ł and ź are not WinAnsi; ó is
    expect(pdfSafeText('1\u202f234,50\u00a0€')).toBe('1\u00a0234,50\u00a0€'); // narrow no-break space (fr-FR grouping)
    expect(pdfSafeText('a\u200bb\tc\r\nd')).toBe('ab c\nd'); // zero-width space dropped, tab to space, CR dropped
    expect(pdfSafeText('Лампа 灯 💡')).toBe('????? ? ?'); // one "?" per character, emoji included
    expect(pdfSafeText('5 \u2103')).toBe('5 °C');
  });

  it('always returns WinAnsi text', () => {
    const samples = ['Δ 3 K → ∞', '✓ ok', '\u0001bell', 'ẞ', '𝔸'];
    for (const s of samples) {
      for (const char of pdfSafeText(s)) expect(isWinAnsi(char.codePointAt(0) ?? 0), `${s} → ${char}`).toBe(true);
    }
  });

  it('prints what it returns: jsPDF standard fonts round-trip through pdftotext', async () => {
    const doc = new jsPDF({ compress: true, unit: 'pt' });
    const lines = ['° ² € – µ × ± é ü ½', pdfSafeText('10 \u03bcF, 5 Ω, ≥ 90'), pdfSafeText('1\u202f234,50 €')];
    lines.forEach((line, i) => doc.text(line, 40, 60 + 20 * i));
    const text = await pdfText(new Uint8Array(doc.output('arraybuffer')));
    // pdftotext may drop spaces between narrow glyphs, so white space is ignored.
    expect(compact(text)).toContain(compact('° ² € – µ × ± é ü ½'));
    expect(compact(text)).toContain(compact('10 µF, 5 ohm, >= 90'));
    expect(compact(text)).toContain(compact('1 234,50 €'));
    // Without the normalisation Greek mu prints as a different glyph.
    const raw = new jsPDF({ compress: true, unit: 'pt' });
    raw.text('10 \u03bcF', 40, 60);
    expect(await pdfText(new Uint8Array(raw.output('arraybuffer')))).not.toContain('µF');
  });
});

describe('figuresFor', () => {
  it('formats money with Intl in the survey currency and falls back to the ISO code when the symbol cannot print', () => {
    const us = figuresFor({ locale: 'en-US', units: 'imperial', money: { currency: 'USD' } });
    // Intl.NumberFormat, en-US currency style (ECMA-402; a general-purpose reference).
    expect(us.money(1234.5)).toBe(new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' }).format(1234.5));
    expect(us.money(1234.5)).toBe('$1,234.50');
    const de = figuresFor({ locale: 'de-DE', units: 'si', money: { currency: 'EUR' } });
    expect(de.money(1234.5)).toBe('1.234,50\u00a0€');
    const india = figuresFor({ locale: 'en-IN', units: 'si', money: { currency: 'INR' } });
    expect(india.money(1234.5)).toMatch(/^INR\s?1,234\.50$/);
  });

  it('writes quantities in the survey units', () => {
    const us = figuresFor({ locale: 'en-US', units: 'imperial', money: { currency: 'USD' } });
    // 1 fc = 1 lm/ft² = 10.7639 lx; 1 ft² = 0.09290304 m² (exact, from the international foot 0.3048 m).
    expect(us.quantity('illuminance', 538.1955)).toBe('50.0 fc');
    expect(us.quantity('area', 92.90304)).toBe('1,000 ft²');
    expect(us.quantity('powerDensity', 10.7639104)).toBe('1.00 W/ft²');
    const si = figuresFor({ locale: 'en-GB', units: 'si', money: { currency: 'GBP' } });
    expect(si.quantity('illuminance', 500)).toBe('500 lx');
    expect(si.quantity('area', 12.5)).toBe('12.5 m²');
    expect(si.quantity('powerDensity', 6.5)).toBe('6.50 W/m²');
  });

  it('says honestly when there is one IRR, several or none', () => {
    const f = figuresFor({ locale: 'en-US', units: 'imperial', money: { currency: 'USD' } });
    expect(f.irr({ kind: 'unique', ratePerYear: 0.1234 })).toBe('12.3 %');
    expect(f.irr({ kind: 'multiple', ratesPerYear: [0.1, 0.5], note: 'x' })).toBe('several rates (10.0 %, 50.0 %); judge by NPV instead');
    expect(f.irr({ kind: 'none', reason: 'every cash flow is zero' })).toBe('none: every cash flow is zero');
    expect(f.payback(null)).toBe('not repaid by the savings');
    expect(f.payback(0)).toBe('immediate (rebates cover the cost)');
    expect(f.payback(2.345)).toBe('2.3 years');
  });
});
