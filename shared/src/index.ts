/**
 * @traceloom/shared — the computation library used by the server, the CLI and the client.
 * `api/` holds the request/response schemas both ends validate with; `engine/` the mathematics.
 */
export * from './api/index.js';
export * from './engine/index.js';
