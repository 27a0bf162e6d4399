// Advice shown with every caution list: common practice of the bench, with no single source.

export const STANDING_ADVICE: readonly string[] = [
  'Treat every capacitor as charged until measured: discharge it through a rated resistor and verify with a meter before touching; short and ground high-voltage banks before work.',
  'Use probes and leads rated for the voltage and measurement category; use a differential probe on a floating node instead of floating the oscilloscope.',
  'Keep one hand away, remove jewellery, and never work alone on energized high-voltage circuits.',
];

/** Where the standing advice comes from. */
export const STANDING_ADVICE_SOURCE = 'common practice, no single source';

/** Always shown: the cautions are guidance, never a clearance. */
export const DEFERRAL =
  'These cautions are guidance, not a clearance: follow your local electrical codes and your organisation\'s licensed practice; this tool is no substitute for them.';
