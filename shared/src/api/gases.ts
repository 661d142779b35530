import { z } from 'zod';
import type { GasSpec, GasSpecInput } from '../engine/spec/schema.js';
import type { PersonRef } from './people.js';
import type { RunStatus } from './runs.js';

// The engine's spec schema and types, from one place for the server's routes and the client's
// forms (the schema module needs only zod and fraction.js, not the engine).
export { gasSpecSchema, type GasSpec, type GasSpecInput } from '../engine/spec/schema.js';

/**
 * Body of `POST /api/studies/:id/gases`, `PUT /api/gases/:id`, `POST /api/compute` and
 * `POST /api/compute/estimate`: the spec itself is checked by the server's spec gate (prototype
 * keys, expression shape) and then `gasSpecSchema`, each naming the field.
 */
export const gasBodySchema = z.strictObject({
  spec: z.unknown().nonoptional({ error: 'is required (the request body is {"spec": <the gas>})' }),
});

/** One line of a study's gas list (`GET /api/studies/:id/gases`). */
export interface GasSummary {
  id: string;
  studyId: string;
  title: string;
  statistics: GasSpec['statistics'];
  weightsKind: GasSpec['weights']['kind'];
  version: number;
  updatedAt: string;
  updatedBy: PersonRef;
  lastRun: { id: string; status: RunStatus; finishedAt: string | null } | null;
}

/** One saved version of a gas, without its spec. */
export interface GasVersionRef {
  version: number;
  createdAt: string;
  createdBy: PersonRef;
}

/** A gas with its current spec and the list of its versions. */
export interface GasDto {
  id: string;
  studyId: string;
  title: string;
  version: number;
  spec: GasSpec;
  versions: GasVersionRef[];
  createdAt: string;
  updatedAt: string;
}

/** One stored version of a gas, read-only. */
export interface GasVersionDto extends GasVersionRef {
  spec: GasSpec;
}

/** What a client sends as a spec: the schema's input (defaults may be left out). */
export type GasSpecBody = { spec: GasSpecInput };
