// Pure colour computations shared by client and server. Conversions and colour
// differences come from colorjs.io; only names and the Bradford step are ours.
export * from './convert.ts';
export * from './difference.ts';
export * from './names.ts';
export * from './hues.ts';
export * from './adapt.ts';
