import { AuditEvent } from './audit-event.entity.js';
import { Comparison } from './comparison.entity.js';
import {
  DatasetComment,
  DatasetReview,
  DatasetReviewRequest,
  DatasetWaiver,
} from './dataset-review.entity.js';
import { Dataset, type DatasetState } from './dataset.entity.js';
import { DatasetView } from './dataset-view.entity.js';
import { GasVersion } from './gas-version.entity.js';
import { Gas } from './gas.entity.js';
import { Invitation } from './invitation.entity.js';
import { ReferenceTable } from './reference-table.entity.js';
import { RunClassPage } from './run-class-page.entity.js';
import { Run, type RunStatus } from './run.entity.js';
import { RateLimit } from './rate-limit.entity.js';
import { Setting } from './setting.entity.js';
import { StudyMember } from './study-member.entity.js';
import { Study } from './study.entity.js';
import { User } from './user.entity.js';

export { AuditEvent, Invitation, Setting, Study, StudyMember, User };
export { Comparison, Gas, GasVersion, ReferenceTable, Run, RunClassPage, type RunStatus };
export { Dataset, DatasetComment, DatasetReview, DatasetReviewRequest, DatasetWaiver };
export { RateLimit, DatasetView };
export type { DatasetState };

/** Every entity, for the data source. */
export const ENTITIES = [
  User,
  Invitation,
  Study,
  StudyMember,
  AuditEvent,
  Setting,
  Gas,
  GasVersion,
  Run,
  RunClassPage,
  ReferenceTable,
  DatasetView,
  Comparison,
  Dataset,
  DatasetReviewRequest,
  DatasetReview,
  DatasetComment,
  DatasetWaiver,
  RateLimit,
];
