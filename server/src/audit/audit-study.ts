/**
 * The SQL that finds the study an audit target belongs to, by target type, with `:id` (or the
 * column expression passed in) as the target id. One place for both the write path (each new
 * event stores its study) and the migration that backfills older events.
 */
export function studyOfTargetSql(targetType: string, id: string): string | null {
  switch (targetType) {
    case 'study':
      // The id itself, so a deleted study's events stay with it (readable by admins only).
      return `(${id})`;
    case 'gas':
      return `(SELECT g."study_id" FROM "gas" g WHERE g."id" = ${id})`;
    case 'run':
      return `(SELECT g."study_id" FROM "run" r JOIN "gas" g ON g."id" = r."gas_id" WHERE r."id" = ${id})`;
    case 'reference':
      return `(SELECT t."study_id" FROM "reference_table" t WHERE t."id" = ${id})`;
    case 'comparison':
      return `(SELECT g."study_id" FROM "comparison" c JOIN "run" r ON r."id" = c."run_id" JOIN "gas" g ON g."id" = r."gas_id" WHERE c."id" = ${id})`;
    case 'dataset':
      return `(SELECT d."study_id" FROM "dataset" d WHERE d."id" = ${id})`;
    default:
      // Users and invitations belong to no study: only admins read their events.
      return null;
  }
}

/** Target types whose events belong to a study. */
export const STUDY_TARGET_TYPES = ['study', 'gas', 'run', 'reference', 'comparison', 'dataset'];

/** Detail keys that carry addresses (e-mail, network): shown to admins only. */
export const ADMIN_ONLY_DETAIL_KEYS = ['email', 'ip', 'emails', 'address', 'to'];

/** The refusal message of the append-only triggers. */
export const AUDIT_APPEND_ONLY = 'audit_append_only';
