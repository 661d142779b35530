/**
 * The command-line bundle's stand-in for the single-file mathjs build (scripts/bundle-cli.mjs
 * maps `mathjs/lib/browser/math.js` here): the same `create` and an `all` holding only the
 * parser and what it depends on. The engine uses mathjs for parsing alone (evaluation is ours,
 * see evaluate.ts), so the parse trees are the same; the bundle then leaves out the other
 * factories and never builds the full default instance the single-file build makes on load.
 */
import { create, parseDependencies } from 'mathjs';

export default { create, all: { parseDependencies } };
