// The one public entry of the numerical core: src/ and server/ import only from here.
export * from './types';
export * from './resonance';
export * from './quantize';
export * from './fixedPoint';
export * from './fixedModel';
export * from './vectors';
export * from './analyze';
export * from './errors';
export * from './polynomial';
export * from './transferFunction';
export * from './stateSpace';
export * from './discretize';
export * from './frequencyResponse';
export * from './margins';
export * from './timeResponse';
export * from './loops';
export * from './signals';
