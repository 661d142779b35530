import { FoundationTables1764619200000 } from './1764619200000-foundation-tables.js';
import { LookupIndexes1764619260000 } from './1764619260000-lookup-indexes.js';
import { GasesRunsReferences1764705600000 } from './1764705600000-gases-runs-references.js';
import { Datasets1764792000000 } from './1764792000000-datasets.js';
import { AuditStudyScope1796300000000 } from './1796300000000-audit-study-scope.js';
import { SignInLimits1796300060000 } from './1796300060000-sign-in-limits.js';
import { RunClassPages1796310000000 } from './1796310000000-run-class-pages.js';
import { DatasetAuthors1796320000000 } from './1796320000000-dataset-authors.js';
import { ReferenceFacts1796330000000 } from './1796330000000-reference-facts.js';
import { ComparisonImpliedWeights1796340000000 } from './1796340000000-comparison-implied-weights.js';
import { DatasetViews1796350000000 } from './1796350000000-dataset-views.js';
import { DatasetBytesLast1796360000000 } from './1796360000000-dataset-bytes-last.js';

/** Committed migrations, oldest first. The first is the baseline. */
export const MIGRATIONS = [
  FoundationTables1764619200000,
  LookupIndexes1764619260000,
  GasesRunsReferences1764705600000,
  Datasets1764792000000,
  AuditStudyScope1796300000000,
  SignInLimits1796300060000,
  RunClassPages1796310000000,
  DatasetAuthors1796320000000,
  ReferenceFacts1796330000000,
  ComparisonImpliedWeights1796340000000,
  DatasetViews1796350000000,
  DatasetBytesLast1796360000000,
];
