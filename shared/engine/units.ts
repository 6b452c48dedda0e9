// Unit conversions. Exact definitions from NIST SP 811, Appendix B.8:
// inch = 25.4 mm, yard = 0.9144 m, ounce (avoirdupois) = 28.349523125 g,
// pound = 453.59237 g. Hence 4 in = 10.16 cm: "per 4 in" and "per 10 cm"
// differ by 1.6 % and are never treated as the same.

export const MM_PER_INCH = 25.4
export const CM_PER_INCH = 2.54
/** 4 in in cm, exactly: the span hand-knitting gauges are quoted over. */
export const CM_PER_4_IN = 10.16
export const METRES_PER_YARD = 0.9144
export const GRAMS_PER_OUNCE = 28.349523125
export const GRAMS_PER_POUND = 453.59237

export const cmToIn = (cm: number): number => cm / CM_PER_INCH
export const inToCm = (inches: number): number => inches * CM_PER_INCH
export const mmToIn = (mm: number): number => mm / MM_PER_INCH
export const inToMm = (inches: number): number => inches * MM_PER_INCH
export const metresToYards = (m: number): number => m / METRES_PER_YARD
export const yardsToMetres = (yd: number): number => yd * METRES_PER_YARD
export const gramsToOunces = (g: number): number => g / GRAMS_PER_OUNCE
export const ouncesToGrams = (oz: number): number => oz * GRAMS_PER_OUNCE
export const gramsToPounds = (g: number): number => g / GRAMS_PER_POUND
export const poundsToGrams = (lb: number): number => lb * GRAMS_PER_POUND

// Yarn grist (length per weight).
export const metresPer100gToYardsPer100g = (m: number): number => metresToYards(m)
export const yardsPer100gToMetresPer100g = (yd: number): number => yardsToMetres(yd)
/** m per 100 g → yd per oz: (m / 0.9144) yd per (100 / 28.349523125) oz. */
export const metresPer100gToYardsPerOunce = (m: number): number => metresToYards(m) * GRAMS_PER_OUNCE / 100
export const yardsPerOunceToMetresPer100g = (ydPerOz: number): number => yardsToMetres(ydPerOz) * 100 / GRAMS_PER_OUNCE
export const metresPer100gToYardsPerPound = (m: number): number => metresToYards(m) * GRAMS_PER_POUND / 100
export const yardsPerPoundToMetresPer100g = (ydPerLb: number): number => yardsToMetres(ydPerLb) * 100 / GRAMS_PER_POUND

// Gauge spans: a count over one span → the same count density over another.
/** Stitches (or rows) per 10 cm → per 4 in. */
export const per10cmToPer4in = (n: number): number => n * CM_PER_4_IN / 10
/** Stitches (or rows) per 4 in → per 10 cm. */
export const per4inToPer10cm = (n: number): number => n * 10 / CM_PER_4_IN
/** Stitches (or rows) per inch → per 10 cm. */
export const perInchToPer10cm = (n: number): number => n * 10 / CM_PER_INCH
/** Stitches (or rows) per 10 cm → per inch. */
export const per10cmToPerInch = (n: number): number => n * CM_PER_INCH / 10
