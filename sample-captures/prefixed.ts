// Engineering notation for the sample captures' README and their --known option text ('47u', '4.7 µH').

const PREFIXES: Record<number, string> = { [-12]: 'p', [-9]: 'n', [-6]: 'u', [-3]: 'm', 0: '', 3: 'k', 6: 'M' };

/** Mantissa and SI prefix letter ('u' for micro) at up to 4 significant digits. */
export function prefixedParts(value: number): { mantissa: string; prefix: string } {
  if (value === 0) return { mantissa: '0', prefix: '' };
  const exponent = Math.min(6, Math.max(-12, 3 * Math.floor(Math.log10(Math.abs(value)) / 3)));
  let mantissa = Number((value / 10 ** exponent).toPrecision(4));
  let e = exponent;
  if (Math.abs(mantissa) >= 1000 && e < 6) {
    mantissa = Number((mantissa / 1000).toPrecision(4));
    e += 3;
  }
  return { mantissa: String(mantissa), prefix: PREFIXES[e] };
}

/** Command-line spelling: '47u', '390p', '0.15'. */
export function optionText(value: number): string {
  const { mantissa, prefix } = prefixedParts(value);
  return mantissa + prefix;
}

/** Display spelling with a unit: '47 µF', '0.15 Ω', '400 ns'. */
export function displayText(value: number, unit: string): string {
  const { mantissa, prefix } = prefixedParts(value);
  return `${mantissa} ${prefix === 'u' ? 'µ' : prefix}${unit}`;
}
