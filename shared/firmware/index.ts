// The one public entry of the firmware model: bit-exact sections (fixed Direct Form I, fixed
// delta-operator, binary32), blocks, the limited PI and PR steps, the set of a design and its
// golden vectors. Builds on shared/control (never the reverse). src/ and server/ import only from here.
export * from './fixedModel';
export * from './deltaModel';
export * from './sections';
export * from './limits';
export * from './set';
export * from './vectors';
