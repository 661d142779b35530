/**
 * The command-line bundle's stand-in for the single-file mathjs build (scripts/bundle-cli.mjs
 * maps `mathjs/lib/browser/math.js` here): the same `create` and an `all` holding only the
 * parser, its node classes and the number types a literal becomes. The engine uses mathjs for
 * parsing alone (evaluation is ours, see evaluate.ts), so the parse trees are the same.
 *
 * mathjs's own `parseDependencies` also pull in what the node classes need to *evaluate*
 * themselves (subset, size, Unit and, through them, matrix, add, pow, inv, det ...): about fifty
 * typed functions built on the first parse, some 0.1 s of a command's start-up. Here those three
 * are stand-ins that throw (the engine never evaluates a mathjs node), and Unit is left out (it
 * is optional to SymbolNode, used only when a node evaluates itself).
 * `parser-only.spec.ts` checks that the parse trees equal those of the full build.
 */
import * as mathjs from 'mathjs';
import { factory, type FactoryFunction } from 'mathjs';

// mathjs exports every factory, but its type declarations name only a few of them
declare module 'mathjs' {
  export const createAccessorNode: FactoryFunction<unknown>;
  export const createArrayNode: FactoryFunction<unknown>;
  export const createAssignmentNode: FactoryFunction<unknown>;
  export const createBigNumberClass: FactoryFunction<unknown>;
  export const createBignumber: FactoryFunction<unknown>;
  export const createBlockNode: FactoryFunction<unknown>;
  export const createConditionalNode: FactoryFunction<unknown>;
  export const createConstantNode: FactoryFunction<unknown>;
  export const createFraction: FactoryFunction<unknown>;
  export const createFractionClass: FactoryFunction<unknown>;
  export const createFunctionAssignmentNode: FactoryFunction<unknown>;
  export const createFunctionNode: FactoryFunction<unknown>;
  export const createIndexNode: FactoryFunction<unknown>;
  export const createNode: FactoryFunction<unknown>;
  export const createNumber: FactoryFunction<unknown>;
  export const createNumeric: FactoryFunction<unknown>;
  export const createObjectNode: FactoryFunction<unknown>;
  export const createOperatorNode: FactoryFunction<unknown>;
  export const createParenthesisNode: FactoryFunction<unknown>;
  export const createParse: FactoryFunction<unknown>;
  export const createRangeNode: FactoryFunction<unknown>;
  export const createRelationalNode: FactoryFunction<unknown>;
  export const createResultSet: FactoryFunction<unknown>;
  export const createSymbolNode: FactoryFunction<unknown>;
  export const createTyped: FactoryFunction<unknown>;
}

/** A dependency the node classes take but only use to evaluate themselves. */
const evaluationOnly = (name: 'subset' | 'size' | 'isBounded') =>
  factory(name, [], () => () => {
    throw new Error(`${name} is not part of the command line's expression parser`);
  });

export default {
  create: mathjs.create,
  all: {
    createAccessorNode: mathjs.createAccessorNode,
    createArrayNode: mathjs.createArrayNode,
    createAssignmentNode: mathjs.createAssignmentNode,
    createBigNumberClass: mathjs.createBigNumberClass,
    createBignumber: mathjs.createBignumber,
    createBlockNode: mathjs.createBlockNode,
    createConditionalNode: mathjs.createConditionalNode,
    createConstantNode: mathjs.createConstantNode,
    createFraction: mathjs.createFraction,
    createFractionClass: mathjs.createFractionClass,
    createFunctionAssignmentNode: mathjs.createFunctionAssignmentNode,
    createFunctionNode: mathjs.createFunctionNode,
    createIndexNode: mathjs.createIndexNode,
    createNode: mathjs.createNode,
    createNumber: mathjs.createNumber,
    createNumeric: mathjs.createNumeric,
    createObjectNode: mathjs.createObjectNode,
    createOperatorNode: mathjs.createOperatorNode,
    createParenthesisNode: mathjs.createParenthesisNode,
    createParse: mathjs.createParse,
    createRangeNode: mathjs.createRangeNode,
    createRelationalNode: mathjs.createRelationalNode,
    createResultSet: mathjs.createResultSet,
    createSymbolNode: mathjs.createSymbolNode,
    createTyped: mathjs.createTyped,
    createSubset: evaluationOnly('subset'),
    createSize: evaluationOnly('size'),
    createIsBounded: evaluationOnly('isBounded'),
  },
};
