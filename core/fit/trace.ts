// The input of a response fit: one channel's samples over time, with the samples the importer found clipped.

export interface Trace {
  time: Float64Array;
  values: Float64Array;
  clipped?: Uint8Array;
  unit: string;
  name?: string;
}
