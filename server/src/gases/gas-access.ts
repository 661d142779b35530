import { PERMISSIONS, may } from '@traceloom/shared/api';
import type { EntityManager } from 'typeorm';
import { Gas } from '../db/entities/index.js';
import { forbidden, notFound } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { canSee, STUDY_RELATIONS } from '../studies/study-access.js';

/** Roles that may define gases and start or cancel runs (with access to the study). */
export const GAS_EDITORS = PERMISSIONS.editGases;

/** Roles that may upload reference tables and compare (reviewers reproduce papers). */
export const CHECKERS = PERMISSIONS.check;

/**
 * Loads a gas whose study the actor may see (deleted gases too: they stay readable by id),
 * with its study and versions; 404 `not_found` when missing or hidden.
 */
export async function loadVisibleGas(
  manager: EntityManager,
  actor: Actor,
  gasId: string,
): Promise<Gas> {
  const gas = await manager.getRepository(Gas).findOne({
    where: { id: gasId },
    relations: { study: STUDY_RELATIONS, versions: { createdBy: true }, updatedBy: true },
  });
  if (!gas || !canSee(actor, gas.study)) throw notFound('The gas');
  return gas;
}

/** Changing a gas, or running it: an author, steward or admin with access to its study. */
export function assertCanChangeGas(actor: Actor): void {
  if (!may(actor.role, 'editGases')) {
    throw forbidden('Only an author, steward or admin may change or run a gas.');
  }
}
