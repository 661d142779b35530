// The engine's ambient module declarations, which the client's tsconfig does not pick up by
// itself (it includes only files under projects/traceloom/src).
// eslint-disable-next-line @typescript-eslint/triple-slash-reference -- an ambient declaration file has no import to use instead
/// <reference path="../../../../../shared/src/engine/expr/mathjs-bundle.d.ts" />
