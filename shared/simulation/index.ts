// The one public entry of the system simulation: src/ and server/ import only from here.
export * from './errors';
export * from './linearAlgebra';
export * from './network';
export * from './integrator';
export * from './grid';
export * from './loads';
export * from './sensing';
export * from './controller';
export * from './referenceController';
export * from './fourier';
export * from './harmonicLimits';
export * from './engine';
export * from './operatingPoint';
export * from './metrics';
export * from './scenarios';
export * from './types';
export * from './simulate';
