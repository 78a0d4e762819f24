// The one public entry of the numerical core: src/ and server/ import only from here.
export * from './types';
export * from './resonance';
export * from './quantize';
export * from './fixedPoint';
export * from './fixedModel';
export * from './vectors';
export * from './analyze';
