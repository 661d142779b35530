import type { MessagePort } from 'node:worker_threads';
import type { RowVerdictDto } from '@traceloom/shared/api';
import {
  EngineError,
  type ComputeResult,
  type GrandProductJson,
  type RunEstimate,
  type SectorPartData,
  type NumericSectorPart,
  type SeriesProductJson,
  type WeightVerdict,
} from '@traceloom/shared/engine';
import type { CompareTask, NumericCompareTask } from '../comparisons/compare-rows.js';
import type { SnapshotOutput, SnapshotTask } from '../datasets/dataset-view.js';
import type { ExportTask, LockDocumentTask } from '../datasets/export-task.js';
import { AppError } from '../http/app-error.js';
import type { ProductTask } from '../products/product-task.js';
import type { ParsedReference } from '../references/reference-parse.js';
import type { ClassPageData } from '../runs/class-pager.js';
import type { SectorAssembleTask, SectorPartsTask } from '../runs/sector-tasks.js';

/**
 * Every task the worker threads run: for each kind, what goes in (plain data, plus a port where
 * the task reports as it goes) and what comes out when it succeeds. The worker's handler table
 * (`runs/worker.ts`) and the server's `runTask` are both typed by this one map, so a task's
 * shape is one edit that both sides compile against.
 */
export interface TaskTypes {
  /** A run: class rows stream out through `port` page by page; the summary's gzip comes back. */
  run: {
    input: { spec: unknown; port: MessagePort };
    output: { gzip: Uint8Array; classCounts: Record<string, number>; pages?: number };
  };
  /** Some sectors of a sector sum (one thread's share of a shell). */
  sectorParts: {
    input: SectorPartsTask;
    output: { parts: SectorPartData[] | NumericSectorPart[] };
  };
  /** The sector sum from its computed shells (progress through `port`). */
  sectorAssemble: {
    input: SectorAssembleTask;
    output: { gzip: Uint8Array; classCounts: Record<string, number> };
  };
  /** A whole result's class rows split into pages (for results assembled from sectors). */
  pageResult: { input: { gzip: Uint8Array }; output: { gzip: Uint8Array; pages: ClassPageData[] } };
  /** The live preview: a small spec computed whole. */
  preview: { input: { spec: unknown }; output: { result: ComputeResult } };
  /** A run's cost and order advice, before it is queued. */
  estimate: { input: { spec: unknown }; output: { estimate: RunEstimate } };
  /** A cut-down spec evaluated before a gas is stored (says through `port` when it begins). */
  probe: { input: { spec: unknown; port: MessagePort }; output: Record<never, never> };
  /** A dataset's snapshot and view made from a run's stored result and class pages. */
  datasetSnapshot: { input: SnapshotTask; output: SnapshotOutput };
  /** A dataset's CSV, LaTeX or coefficient-matrix export rendered from its snapshot text. */
  datasetExport: { input: ExportTask; output: { body: Uint8Array } };
  /** A dataset's locked document built, canonicalized and hashed. */
  lockDocument: { input: LockDocumentTask; output: { canonical: string; hash: string } };
  /** A dataset's snapshot computed again and compared with the stored result. */
  verify: { input: { snapshot: string }; output: { mismatches: string[] } };
  /** Reference rows against a series run. */
  compare: {
    input: CompareTask;
    /** `impliedWeights`: the Z_L the table's rows imply, beside the run's (null without weights). */
    output: { rows: RowVerdictDto[]; impliedWeights?: WeightVerdict[] | null };
  };
  /** Reference rows against a numeric run (its spec computed again to the table's largest N). */
  compareNumeric: {
    input: NumericCompareTask;
    output: { rows: RowVerdictDto[]; impliedWeights?: WeightVerdict[] | null };
  };
  /** One series or the grand function written as a product. */
  productForm: { input: ProductTask; output: { product: SeriesProductJson | GrandProductJson } };
  /** An uploaded reference table read and checked. */
  reference: {
    input: {
      bytes: Uint8Array;
      filename: string;
      contentType: string;
      normalization?: string;
      variable?: string;
    };
    output: { parsed: ParsedReference };
  };
}

/** A task kind. */
export type TaskKind = keyof TaskTypes;

/** What a task of kind `K` takes. */
export type TaskInput<K extends TaskKind> = TaskTypes[K]['input'];

/** What a task of kind `K` gives when it succeeds. */
export type TaskOutput<K extends TaskKind> = TaskTypes[K]['output'];

/** The message the pool carries: the kind beside the input's fields. */
export type TaskMessage<K extends TaskKind = TaskKind> = { kind: K } & TaskInput<K>;

/**
 * Why a task gave no output — the one refusal shape every kind answers. An engine refusal names
 * the field; an API error raised in the worker keeps its `status` and `code`; `internal` marks an
 * engine failure that is not a refusal (a bug met on this input), reported without its stack.
 */
export interface WorkerRefusal {
  ok: false;
  message: string;
  field: string | undefined;
  status?: number;
  code?: string;
  internal?: boolean;
}

/** A finished run: the gzip of the result JSON without class rows, the class rows per N. */
export type RunOutput = { ok: true } & TaskOutput<'run'>;

/** What a task of kind `K` answers: its output, or the refusal. */
export type TaskResult<K extends TaskKind> = ({ ok: true } & TaskOutput<K>) | WorkerRefusal;

/** The refusal for an error thrown by a task (in the worker). */
export function refusalOf(e: unknown): WorkerRefusal {
  if (e instanceof EngineError) return { ok: false, message: e.message, field: e.field };
  if (e instanceof AppError) {
    const { status, code, message, field } = e;
    return { ok: false, message, field, status, code };
  }
  const what = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
  return {
    ok: false,
    message: `the engine failed on this input (${what.slice(0, 200)})`,
    field: undefined,
    internal: true,
  };
}
