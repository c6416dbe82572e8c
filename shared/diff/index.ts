/** Comparing two revisions of an entry: text, cell inputs and cell results by meaning. Pure: no DOM, no HTTP. */
export * from './format.ts';
export * from './text-diff.ts';
export * from './cell-input-diff.ts';
export * from './result-diff.ts';
export * from './revision-diff.ts';
