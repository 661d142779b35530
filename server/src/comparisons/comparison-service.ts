import type { ReferenceRow } from '@traceloom/shared/api';
import { comparisonBodySchema } from '@traceloom/shared/api';
import type { ComparisonDto, RowVerdictDto } from '@traceloom/shared/api';
import type { ValueJson, WeightVerdict } from '@traceloom/shared/engine';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { isNumericResult, isNumericVerdict, readVerdict } from '@traceloom/shared/format';
import type { TaskOptions } from '../compute/run-task.js';
import { Comparison } from '../db/entities/index.js';
import { AppError } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { parseInput } from '../http/validate.js';
import { loadVisibleRun, loadResult } from '../runs/run-service.js';
import { isNumericTable } from '../references/reference-parse.js';
import { loadVisibleReference } from '../references/reference-service.js';

/** Wall-clock limit of one comparison in the worker. */
const COMPARE_LIMIT_MS = 10_000;

function toDto(c: Comparison, runId: string): ComparisonDto {
  const rows = (JSON.parse(c.verdicts) as RowVerdictDto[]).map(readVerdict);
  return {
    id: c.id,
    runId,
    referenceId: c.reference?.id ?? null,
    kind: c.kind,
    normalization: c.normalization,
    rows,
    summary: { agreeing: rows.filter((r) => r.agrees).length, total: rows.length },
    impliedWeights: c.impliedWeights ? (JSON.parse(c.impliedWeights) as WeightVerdict[]) : null,
    createdAt: c.createdAt,
  };
}

/**
 * `POST /runs/:id/comparisons`: row verdicts of a finished run against a reference table of the
 * same study (computed in a worker), or its grand check; stored and returned.
 */
export async function createComparison(
  ctx: AppContext,
  actor: Actor,
  runId: string,
  body: unknown,
): Promise<ComparisonDto> {
  const input = parseInput(comparisonBodySchema, body);
  const run = await loadVisibleRun(ctx, actor, runId);
  const result = run.status === 'done' ? await loadResult(ctx, run) : null;
  if (!result) {
    throw new AppError(409, 'run_not_done', `The run is ${run.status}; compare a finished run.`);
  }
  let rows: RowVerdictDto[];
  let impliedWeights: WeightVerdict[] | null = null;
  let normalization = '1';
  let referenceId: string | null = null;
  if ('grand' in input) {
    if (!result.grandCheck) {
      throw new AppError(
        409,
        'no_grand_check',
        "This run's gas states no grand function to check.",
        'grand',
      );
    }
    rows = result.grandCheck.map((v) =>
      isNumericVerdict(v)
        ? {
            N: v.N,
            agrees: v.agrees,
            tolerance: v.tolerance,
            difference: v.difference,
            computed: v.computed,
            supplied: v.supplied,
          }
        : v,
    );
  } else {
    const table = await loadVisibleReference(ctx, actor, input.referenceId, 'referenceId');
    if (table.study.id !== run.gas.study.id) {
      throw new AppError(
        400,
        'invalid_input',
        'referenceId: the table belongs to another study.',
        'referenceId',
      );
    }
    referenceId = table.id;
    normalization = table.normalization;
    const refRows = JSON.parse(table.rows) as ReferenceRow[];
    const nMax = result.canonical.length - 1;
    const beyond = refRows.find((r) => r.N > nMax);
    if (beyond) {
      throw new AppError(
        400,
        'invalid_input',
        `referenceId: line ${beyond.line} has N = ${beyond.N}, beyond this run's nMax = ${nMax}.`,
        'referenceId',
      );
    }
    if (table.variable !== result.spec.variable) {
      throw new AppError(
        400,
        'invalid_input',
        `referenceId: the table is in ${table.variable}, the run in ${result.spec.variable}.`,
        'referenceId',
      );
    }
    const numeric = isNumericResult(result);
    if (!numeric && isNumericTable(refRows)) {
      throw new AppError(
        400,
        'invalid_input',
        'referenceId: the table holds decimal numbers; compare it with a numeric run (a gas with precision, and at for a formula or spectrum).',
        'referenceId',
      );
    }
    // A numeric comparison computes the run's spec again (up to the table's largest N) with the
    // table as its reference: it gets a run's worker and wall-clock limit.
    const options: TaskOptions = {
      timeoutMs: numeric ? ctx.config.runs.wallClockMs : COMPARE_LIMIT_MS,
      refused: (r) =>
        new AppError(
          400,
          'invalid_input',
          `${r.field ?? 'reference'}: ${r.message}.`,
          r.field === 'normalization' ? 'normalization' : 'referenceId',
        ),
    };
    const { tasks } = ctx.services;
    const output = numeric
      ? await tasks.runTask(
          'compareNumeric',
          { spec: result.spec, normalization, rows: refRows },
          options,
        )
      : await tasks.runTask(
          'compare',
          {
            canonical: result.canonical.map((row) => row.value as ValueJson),
            variable: result.spec.variable,
            order: result.spec.order ?? null,
            normalization,
            rows: refRows,
            weights: result.weights.map((w) => w.value as ValueJson),
            fermion: result.spec.statistics === 'fermion',
          },
          options,
        );
    rows = output.rows;
    impliedWeights = output.impliedWeights ?? null;
  }
  return ctx.dataSource.transaction(async (manager) => {
    const repo = manager.getRepository(Comparison);
    const saved = await repo.save(
      repo.create({
        run: { id: runId },
        reference: referenceId ? { id: referenceId } : null,
        kind: referenceId ? 'reference' : 'grand',
        normalization,
        verdicts: JSON.stringify(rows),
        impliedWeights: impliedWeights ? JSON.stringify(impliedWeights) : null,
        createdBy: { id: actor.id },
        createdAt: new Date().toISOString(),
      }),
    );
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'comparison.create',
      targetType: 'comparison',
      targetId: saved.id,
      detail: {
        runId,
        referenceId,
        agreeing: rows.filter((r) => r.agrees).length,
        total: rows.length,
      },
    });
    return toDto(
      await repo.findOneOrFail({ where: { id: saved.id }, relations: { reference: true } }),
      runId,
    );
  });
}

/** The comparisons of a run, oldest first. */
export async function listComparisons(
  ctx: AppContext,
  actor: Actor,
  runId: string,
): Promise<ComparisonDto[]> {
  await loadVisibleRun(ctx, actor, runId);
  const list = await ctx.dataSource.getRepository(Comparison).find({
    where: { run: { id: runId } },
    relations: { reference: true },
    order: { createdAt: 'ASC' },
  });
  return list.map((c) => toDto(c, runId));
}
