import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { User } from './user.entity.js';

/** Who did what, to what, when. Written by every state change; append-only (triggers). */
@Entity('audit_event')
@Index('IDX_audit_event_target', ['targetType', 'targetId'])
@Index('IDX_audit_event_study', ['studyId', 'createdAt'])
export class AuditEvent {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'actor_id' })
  actor!: Relation<User>;

  /** Dotted action name, e.g. `study.create`. */
  @Column('varchar', { length: 64 })
  action!: string;

  @Column('varchar', { name: 'target_type', length: 32 })
  targetType!: string;

  /** Kept as plain text so events outlive the thing they describe. */
  @Column('varchar', { name: 'target_id', length: 36 })
  targetId!: string;

  /** The study the target belongs to (NULL for users and invitations): who may read it. */
  @Column('varchar', { name: 'study_id', length: 36, nullable: true })
  studyId!: string | null;

  /** JSON text with the details of the change. */
  @Column('text', { default: '{}' })
  detail!: string;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;
}
