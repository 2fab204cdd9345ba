// Types for the parts of spectral.js (npm, MIT) the tests use as an independent Kubelka–Munk implementation.
declare module 'spectral.js' {
  export class Color {
    constructor(reflectance: number[]);
    /** Reflectance of each of its 38 bands (380–750 nm at 10 nm). */
    readonly R: number[];
    /** Kubelka–Munk K/S of each band. */
    readonly KS: number[];
  }
  export function mix(...colours: Array<[Color, number]>): Color;
  const spectral: { Color: typeof Color; mix: typeof mix };
  export default spectral;
}
