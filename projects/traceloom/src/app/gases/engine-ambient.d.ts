// The engine's ambient module declarations, which the client's tsconfig does not pick up by
// itself (it includes only files under projects/traceloom/src).
/// <reference path="../../../../../shared/src/engine/expr/mathjs-bundle.d.ts" />
