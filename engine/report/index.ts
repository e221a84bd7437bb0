// Public API of the report layer: CSV output and the notes printed with results.
export * from './csv.ts';
export * from './cautions.ts';
