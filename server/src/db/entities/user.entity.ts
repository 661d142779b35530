import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Role } from '@traceloom/shared/api';

/** A person who can sign in (or has been invited to). */
@Entity('user')
export class User {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  /** Stored lower-cased; unique. */
  @Column('varchar', { length: 254, unique: true })
  email!: string;

  @Column('varchar', { name: 'display_name', length: 100 })
  displayName!: string;

  @Column('varchar', { length: 16 })
  role!: Role;

  /** `scrypt$N$r$p$salt$hash`, or an unusable marker for invited people without a password. */
  @Column('varchar', { name: 'password_hash', length: 300 })
  passwordHash!: string;

  /** Bumped on logout, role change and disable; tokens carry it and must match. */
  @Column('integer', { name: 'token_version', default: 0 })
  tokenVersion!: number;

  @Column('boolean', { default: false })
  disabled!: boolean;

  /** ISO time. */
  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;
}
