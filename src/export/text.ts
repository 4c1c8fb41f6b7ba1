/**
 * Text for PDFs made with jsPDF's built-in fonts. Those fonts encode text as
 * WinAnsi (Windows code page 1252): ASCII, Latin-1 and 27 extra characters
 * such as € – — ‘ ’ “ ” • … ™. Anything else prints as a wrong glyph, so
 * every string drawn into a PDF goes through {@link pdfSafeText} first.
 */

/** The 27 characters WinAnsi adds in 0x80–0x9F, as Unicode code points. */
const winAnsiExtras = new Set([
  0x20ac, 0x201a, 0x0192, 0x201e, 0x2026, 0x2020, 0x2021, 0x02c6, 0x2030, 0x0160, 0x2039, 0x0152, 0x017d, 0x2018,
  0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x02dc, 0x2122, 0x0161, 0x203a, 0x0153, 0x017e, 0x0178,
]);

/**
 * True when one code point prints with the standard PDF fonts (WinAnsi), or
 * is a line feed (kept: the layout code splits lines on it).
 *
 * @example isWinAnsi('µ'.codePointAt(0)!) //=> true
 */
export function isWinAnsi(codePoint: number): boolean {
  if (codePoint === 0x0a) return true;
  if (codePoint >= 0x20 && codePoint <= 0x7e) return true;
  if (codePoint >= 0xa0 && codePoint <= 0xff) return true;
  return winAnsiExtras.has(codePoint);
}

/** Replacements chosen by hand: meaning first, then looks. */
const replacements: Readonly<Record<string, string>> = {
  '\u03bc': '\u00b5', // Greek small mu (phone keyboards) → micro sign
  '\u03a9': 'ohm',
  '\u2126': 'ohm', // ohm sign
  '\u2265': '>=',
  '\u2264': '<=',
  '\u2260': '!=',
  '\u2248': '~',
  '\u223c': '~',
  '\u2212': '-', // minus sign
  '\u2010': '-',
  '\u2011': '-',
  '\u2012': '\u2013',
  '\u2015': '\u2014',
  '\u2032': "'",
  '\u2033': '"',
  '\u2192': '->',
  '\u2190': '<-',
  '\u2194': '<->',
  '\u21d2': '=>',
  '\u221e': 'infinity',
  '\u221a': 'sqrt',
  '\u2211': 'sum',
  '\u2103': '\u00b0C',
  '\u2109': '\u00b0F',
  '\u2116': 'No.',
  '\u2713': 'yes',
  '\u2714': 'yes',
  '\u2717': 'no',
  '\u2718': 'no',
  '\u0394': 'Delta ',
  '\u03b1': 'alpha',
  '\u03b2': 'beta',
  '\u03b3': 'gamma',
  '\u03b4': 'delta',
  '\u03bb': 'lambda',
  '\u03c0': 'pi',
  '\u03c3': 'sigma',
  '\u03c6': 'phi',
  '\u0141': 'L',
  '\u0142': 'l',
  '\u0110': 'D',
  '\u0111': 'd',
  '\u0131': 'i',
  '\t': ' ',
  '\r': '',
  // Spaces: the narrow no-break space (French and Swiss number grouping) stays unbreakable.
  '\u202f': '\u00a0',
  '\u2007': '\u00a0',
  '\u2060': '',
  '\u200b': '',
  '\u200c': '',
  '\u200d': '',
  '\ufeff': '',
};

function replaceOne(char: string): string {
  const codePoint = char.codePointAt(0) ?? 0;
  if (isWinAnsi(codePoint)) return char;
  const fixed = replacements[char];
  if (fixed !== undefined) return fixed;
  // Other spaces (en, em, thin, hair…) print as a plain space.
  if ((codePoint >= 0x2000 && codePoint <= 0x200a) || codePoint === 0x205f || codePoint === 0x3000) return ' ';
  // Control characters are dropped.
  if (codePoint < 0x20 || (codePoint >= 0x7f && codePoint < 0xa0)) return '';
  // Compatibility forms: subscript/superscript digits (CO₂), ligatures (ﬁ), full-width letters.
  const compatible = char.normalize('NFKC');
  if (compatible !== char && [...compatible].every((c) => isWinAnsi(c.codePointAt(0) ?? 0))) return compatible;
  // Letters with accents WinAnsi lacks (ő, č, ş): keep the base letter.
  const base = char.normalize('NFKD').replace(/[\u0300-\u036f]/g, '');
  if (base !== '' && base !== char && [...base].every((c) => isWinAnsi(c.codePointAt(0) ?? 0))) return base;
  return '?';
}

/**
 * Makes text printable with jsPDF's standard fonts: keeps everything WinAnsi
 * holds (° ² € – µ × ± é ü ½ …), turns Greek μ into the micro sign µ, Ω into
 * "ohm", ≥ and ≤ into ">=" and "<=", the minus sign into "-", narrow and
 * other special spaces into (no-break) spaces, CO₂-style subscripts and
 * ligatures into plain letters, accented letters WinAnsi lacks into their
 * base letter, drops control characters and zero-width marks, and prints any
 * other character (Cyrillic, CJK, emoji) as "?". Line feeds are kept.
 *
 * @example pdfSafeText('10 μF, 5 Ω, ≥ 90 CRI, CO₂') //=> '10 µF, 5 ohm, >= 90 CRI, CO2'
 */
export function pdfSafeText(text: string): string {
  let out = '';
  for (const char of text) out += replaceOne(char);
  return out;
}
