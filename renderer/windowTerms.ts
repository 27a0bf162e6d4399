// Messages from the shared core name command-line options; in the window they name the window's own controls.

/**
 * Each option as the window offers it, longer phrases first (a whole advice before the bare flag). An option the
 * window has no control for (--sort-time) is left as the command line says it.
 */
const TERMS: [RegExp, string][] = [
  [/with --time-unit or --sample-interval/g, "with the 'Time in' choice or the 'Sample interval' field"],
  [/(?:the )?option sampleInterval|the sampleInterval option|--sample-interval/g, "the 'Sample interval' field"],
  [/with --time-unit/g, "with the 'Time in' choice"],
  [/with --value-unit/g, "with the 'Values in' choice"],
  [/--time-unit (\S+?)(?=[\s,;.)]|$)/g, "the 'Time in' choice ($1)"],
  [/--time-unit/g, "the 'Time in' choice"],
  [/--value-unit (\S+?)(?=[\s,;.)]|$)/g, "the 'Values in' choice ($1)"],
  [/--value-unit/g, "the 'Values in' choice"],
  [/with --column/g, "with the 'Channel' choice"],
  [/\(--column\)/g, "(the 'Channel' choice)"],
  [/--event N fits another/g, "the 'Event to fit' choice takes another"],
  // A record fitted whole shows no event choice: a window around one event fits it alone.
  [/\(--event N fits one of the events\)/g, "(set 'Window from' and 'to' around one to fit it alone)"],
  [/--event/g, "'Event to fit'"],
  [/--segment/g, "'Segment'"],
  [/--modes/g, "'Modes'"],
  [/--mode\b/g, 'the mode chosen for R, L and C'],
  [/\(--from, --to\)/g, "('Window from' and 'to')"],
  [/--from\/--to/g, "'Window from' and 'to'"],
  [/--from/g, "'Window from'"],
  [/--to\b/g, "'to'"],
  [/--known/g, "'Known part'"],
  [/--topology/g, "'Topology'"],
  [/--added/g, "'added C'"],
  [/--voltage and --switching-frequency/g, "'Snubber voltage swing' and 'Switching frequency'"],
  [/--scope-bandwidth/g, "'Bandwidth'"],
  [/--probe-capacitance|--probe-c\b/g, "'Probe C'"],
  [/--ground-lead/g, "'Ground lead'"],
  [/--probe-ratio/g, "the channel's probe ratio"],
  [/--invert/g, "the channel's 'invert'"],
];

/** The message with each command-line option it names put as the window's control for it. */
export function inWindowTerms(message: string): string {
  return TERMS.reduce((text, [pattern, words]) => text.replace(pattern, words), message);
}
