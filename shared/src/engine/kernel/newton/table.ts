/**
 * The canonical table by the Newton recursion N Z(N) = sum_L s^(L-1) Z_L Z(N-L), exactly, on an
 * integer grid: runs the route chooseNewtonRoute (route.ts) picked, and undoes a grid
 * compression afterwards.
 */
import { newtonTableBig } from './big.js';
import { expandResult } from './grid-compression.js';
import { newtonTableModular } from './modular-table.js';
import { chooseNewtonRoute, type NewtonRoute } from './route.js';
import type { NewtonTableInput, NewtonTableResult } from './types.js';

export { newtonTableModular } from './modular-table.js';

/**
 * Z(0..nMax) exactly from integer weight numerators on a common grid from exponent 0 with common
 * denominator `den`: Z(N) at t^i is num[N][i] / den[N]. `route` defaults to the one
 * chooseNewtonRoute picks for the input (it must not be the series route).
 */
export function newtonTable(
  input: NewtonTableInput,
  route: NewtonRoute = chooseNewtonRoute(input),
): NewtonTableResult {
  if (route.kind === 'series') throw new RangeError(`no kernel route: ${route.reason}`);
  const r =
    route.kind === 'modular'
      ? newtonTableModular(route.grid, route.integral)
      : newtonTableBig(route.grid);
  const shape = route.compression;
  return shape ? expandResult(r, shape.g, shape.c, input.length) : r;
}
