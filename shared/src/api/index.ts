/**
 * The HTTP API's request schemas (zod) and answer types, shared by the server (validation at the
 * boundary, repositories mapping to these shapes) and the client (forms and typed answers): a
 * change to a request or an answer is one edit here that both sides compile against. One file
 * per resource; nothing here imports the engine's code (types and the spec schema only).
 */
export * from './roles.js';
export * from './fields.js';
export * from './people.js';
export * from './auth.js';
export * from './users.js';
export * from './studies.js';
export * from './gases.js';
export * from './runs.js';
export * from './references.js';
export * from './comparisons.js';
export * from './products.js';
export * from './datasets.js';
export * from './dataset-documents.js';
export * from './audit.js';
export * from './mailbox.js';
export * from './invitations.js';
