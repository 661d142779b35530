/**
 * The result format for people: one module turns result JSON into text, CSV, LaTeX and the
 * coefficient matrix, and reads stored verdicts; used by the CLI, the server and the client.
 * It imports no engine code (types only), so the client can load it without the engine.
 */
export * from './gas-definition.js';
export * from './known.js';
export * from './largen-text.js';
export * from './latex-layout.js';
export * from './matrix.js';
export * from './numeric.js';
export * from './numeric-render.js';
export * from './render.js';
export * from './render-latex.js';
export * from './sectors-text.js';
export * from './tables.js';
export * from './values.js';
export * from './verdicts.js';
export * from './vocabulary.js';
