export * from './vapour.ts';
export * from './potentialTemperature.ts';
export * from './equivalentPotentialTemperature.ts';
export * from './lcl.ts';
export * from './pseudoAdiabat.ts';
export * from './wetBulb.ts';
