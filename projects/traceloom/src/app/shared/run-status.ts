import type { RunStatus } from '@traceloom/shared/api';

/** Status words (never colour alone). */
export const STATUS_LABELS: Record<RunStatus, string> = {
  queued: 'Queued',
  running: 'Running',
  done: 'Done',
  failed: 'Failed',
  cancelled: 'Cancelled',
};

/** An icon per status, shown beside the word. */
export const STATUS_ICONS: Record<RunStatus, string> = {
  queued: 'schedule',
  running: 'autorenew',
  done: 'check_circle',
  failed: 'error',
  cancelled: 'cancel',
};

/** A duration in ms as `0.8 s`, `12 s` or `3 min 4 s`. */
export function durationText(ms: number | null): string {
  if (ms === null || ms === undefined) return '—';
  if (ms < 10_000) return `${(ms / 1000).toFixed(1)} s`;
  const s = Math.round(ms / 1000);
  return s < 60 ? `${s} s` : `${Math.floor(s / 60)} min ${s % 60} s`;
}
