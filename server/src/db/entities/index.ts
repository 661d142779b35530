import { AuditEvent } from './audit-event.entity.js';
import { Invitation } from './invitation.entity.js';
import { Setting } from './setting.entity.js';
import { StudyMember } from './study-member.entity.js';
import { Study } from './study.entity.js';
import { User } from './user.entity.js';

export { AuditEvent, Invitation, Setting, Study, StudyMember, User };

/** Every entity, for the data source. */
export const ENTITIES = [User, Invitation, Study, StudyMember, AuditEvent, Setting];
