// The single-file build of mathjs loads in a fraction of the time of its many-module entry.
declare module 'mathjs/lib/browser/math.js' {
  import * as mathjs from 'mathjs';
  const bundle: typeof mathjs;
  export default bundle;
}
