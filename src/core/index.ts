/**
 * Foldlens core: orientation geometry and statistics in pure TypeScript (no DOM), shared by the
 * browser, web workers, Node tests and the command line.
 *
 * Convention: north-east-down direction cosines; angles at the API in degrees (see types.ts).
 */
export * from './types';
export * from './math';
export * from './vectors';
export * from './station';
export * from './notation';
export * from './rake';
export * from './geometry';
export * from './netProjection';
export * from './eigen';
export * from './orientationTensor';
export * from './shapeIndices';
export * from './fisher';
export * from './girdle';
export * from './betaAxis';
export * from './random';
export * from './bootstrap';
export * from './foldAnalysis';
export * from './foldDescription';
export * from './cylindricity';
export * from './limbModes';
export * from './density';
export * from './kamb';
export * from './exponentialDensity';
export * from './polygon';
export * from './liveSelection';
export * from './webMercator';
export * from './foldInput';
export * from './domain';
export * from './downPlunge';
export * from './profileAttitude';
export * from './apparentDip';
export * from './verticalSection';
export * from './hingeMean';
export * from './numberField';
export * from './typedAxis';
export * from './sectionLineDraft';
export * from './profileScatter';
export * from './profileLayout';
export * from './densityNodes';
