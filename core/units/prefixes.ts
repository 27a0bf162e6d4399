// SI prefixes and the unit symbols the program reads and writes.

/** Prefix letter to power of ten. 'u', 'µ' (micro sign) and 'μ' (Greek mu) all mean micro; 'M' is mega, 'm' milli. */
export const PREFIX_EXPONENT: Readonly<Record<string, number>> = {
  f: -15,
  p: -12,
  n: -9,
  u: -6,
  '\u00b5': -6,
  '\u03bc': -6,
  m: -3,
  k: 3,
  M: 6,
  G: 9,
};

/** Display prefixes by power of ten (micro shown as 'µ'). */
export const DISPLAY_PREFIX: Readonly<Record<number, string>> = {
  [-15]: 'f',
  [-12]: 'p',
  [-9]: 'n',
  [-6]: '\u00b5',
  [-3]: 'm',
  0: '',
  3: 'k',
  6: 'M',
  9: 'G',
};

/** Spellings accepted for each SI unit the program knows, keyed by the internal unit string. */
const UNIT_SPELLINGS: Readonly<Record<string, readonly string[]>> = {
  s: ['s', 'sec'],
  V: ['V'],
  A: ['A'],
  W: ['W'],
  J: ['J'],
  Hz: ['Hz'],
  F: ['F'],
  H: ['H'],
  ohm: ['ohm', 'Ohm', 'ohms', 'Ohms', '\u03a9', '\u2126'],
};

const CANONICAL_UNIT = new Map<string, string>(
  Object.entries(UNIT_SPELLINGS).flatMap(([unit, spellings]) => spellings.map((s) => [s, unit] as const)),
);

/** The internal unit string for a spelling ('Ω' -> 'ohm', 'sec' -> 's'), or null when unknown. */
export function canonicalUnit(spelling: string): string | null {
  return CANONICAL_UNIT.get(spelling) ?? null;
}

/** How a unit is written for display ('ohm' -> 'Ω'). */
export function displayUnit(unit: string): string {
  return unit === 'ohm' ? '\u03a9' : unit;
}
