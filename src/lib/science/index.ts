// Hopline's science engine: pure functions, no I/O. Each file documents its equations and sources.
export * from './constants';
export * from './units';
export * from './referenceElectrodes';
export * from './nernst';
export * from './protonCoupling';
export * from './temperatureDependence';
export * from './electronTransfer';
export * from './random';
export * from './truncatedNormal';
export * from './chainKinetics';
export * from './leastSquares';
export * from './titrationFit';
export * from './symmetricEigen';
export * from './tunnelling';
export * from './structure';
export * from './structureMatch';
export * from './spectra';
