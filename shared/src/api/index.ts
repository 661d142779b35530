/**
 * The HTTP API's request schemas (zod) and answer types, shared by the server (validation at the
 * boundary) and the client (forms and typed answers).
 */
export * from './roles.js';
export * from './fields.js';
export * from './auth.js';
export * from './users.js';
export * from './studies.js';
export * from './datasets.js';
