import {
  PERMISSIONS,
  memberAddSchema,
  studyCreateSchema,
  studyPatchSchema,
} from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { parseId, parseInput } from '../http/validate.js';
import {
  addMember,
  createStudy,
  deleteStudy,
  getStudy,
  listStudies,
  patchStudy,
  removeMember,
} from './study-service.js';

/** Roles that can own a study, and so create, edit, delete and manage members of one. */
const STUDY_EDITORS = PERMISSIONS.editStudies;

/** Study routes. Route-level roles first; owner/member checks happen in the domain functions. */
export function studyRoutes(ctx: AppContext): RouteSpec[] {
  const study = (id: string | undefined) => parseId(id, 'The study');
  return [
    {
      method: 'get',
      path: '/studies',
      access: ANY_ROLE,
      handler: ({ actor }) => listStudies(ctx, actor),
    },
    {
      method: 'post',
      path: '/studies',
      access: STUDY_EDITORS,
      status: 201,
      handler: ({ actor, body }) => createStudy(ctx, actor, parseInput(studyCreateSchema, body)),
    },
    {
      method: 'get',
      path: '/studies/:id',
      access: ANY_ROLE,
      handler: ({ actor, params }) => getStudy(ctx, actor, study(params.id)),
    },
    {
      method: 'patch',
      path: '/studies/:id',
      access: STUDY_EDITORS,
      handler: ({ actor, params, body }) =>
        patchStudy(ctx, actor, study(params.id), parseInput(studyPatchSchema, body)),
    },
    {
      method: 'delete',
      path: '/studies/:id',
      access: STUDY_EDITORS,
      status: 204,
      handler: ({ actor, params }) => deleteStudy(ctx, actor, study(params.id)),
    },
    {
      method: 'post',
      path: '/studies/:id/members',
      access: STUDY_EDITORS,
      status: 201,
      handler: ({ actor, params, body }) =>
        addMember(ctx, actor, study(params.id), parseInput(memberAddSchema, body)),
    },
    {
      method: 'delete',
      path: '/studies/:id/members/:userId',
      access: STUDY_EDITORS,
      handler: ({ actor, params }) =>
        removeMember(ctx, actor, study(params.id), parseId(params.userId, 'The member')),
    },
  ];
}
