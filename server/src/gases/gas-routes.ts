import type { AppContext } from '../app-context.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { parseId } from '../http/validate.js';
import { GAS_EDITORS } from './gas-access.js';
import { parseGasBody } from './gas-input.js';
import { assertNamesKnown } from './gas-names.js';
import { assertSpecEvaluates } from './gas-probe.js';
import {
  createGas,
  deleteGas,
  getGas,
  getGasVersion,
  listGases,
  updateGas,
} from './gas-service.js';

/** Gas routes: a study's gases, one gas, its versions. Study access is checked in the service. */
export function gasRoutes(ctx: AppContext): RouteSpec[] {
  const study = (id: string | undefined) => parseId(id, 'The study');
  const gas = (id: string | undefined) => parseId(id, 'The gas');
  const checkedSpec = async (body: unknown) => {
    const spec = parseGasBody(body);
    assertNamesKnown(spec);
    await assertSpecEvaluates(ctx, spec);
    return spec;
  };
  return [
    {
      method: 'get',
      path: '/studies/:id/gases',
      access: ANY_ROLE,
      handler: ({ actor, params }) => listGases(ctx, actor, study(params.id)),
    },
    {
      method: 'post',
      path: '/studies/:id/gases',
      access: GAS_EDITORS,
      status: 201,
      handler: async ({ actor, params, body }) =>
        createGas(ctx, actor, study(params.id), await checkedSpec(body)),
    },
    {
      method: 'get',
      path: '/gases/:id',
      access: ANY_ROLE,
      handler: ({ actor, params }) => getGas(ctx, actor, gas(params.id)),
    },
    {
      method: 'get',
      path: '/gases/:id/versions/:version',
      access: ANY_ROLE,
      handler: ({ actor, params }) => getGasVersion(ctx, actor, gas(params.id), params.version),
    },
    {
      method: 'put',
      path: '/gases/:id',
      access: GAS_EDITORS,
      handler: async ({ actor, params, body }) =>
        updateGas(ctx, actor, gas(params.id), await checkedSpec(body)),
    },
    {
      method: 'delete',
      path: '/gases/:id',
      access: GAS_EDITORS,
      status: 204,
      handler: ({ actor, params }) => deleteGas(ctx, actor, gas(params.id)),
    },
  ];
}
