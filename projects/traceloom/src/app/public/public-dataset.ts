import { DatePipe } from '@angular/common';
import { DatasetChecks } from '../datasets/dataset-checks';
import { AsyncState } from '../shared/async-state';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { DatasetsApi, PublicDatasetDto } from '../datasets/datasets-api';
import {
  checkStatusText,
  gasDefinition,
  knownSentence,
  rowValueText,
} from '@traceloom/shared/format';
import { LogoMark } from '../shell/logo-mark';

/**
 * The public, read-only page of a locked dataset (`/public/:hash`, no sign-in): what it is, its
 * canonical table, checks and reviews, the citation line and the hashed JSON to check it with.
 */
@Component({
  selector: 'tl-public-dataset',
  imports: [DatePipe, MatButtonModule, MatIconModule, LogoMark, DatasetChecks, AsyncState],
  templateUrl: './public-dataset.html',
  styleUrl: './public-dataset.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PublicDatasetPage {
  private readonly api = inject(DatasetsApi);

  /** Route `public/:hash`. */
  readonly hash = input.required<string>();

  /** The locked dataset, read through the datasets api. */
  protected readonly resource = this.api.publicDatasetResource(() => this.hash());
  protected readonly data = computed(() =>
    this.resource.hasValue() ? this.resource.value()! : null,
  );
  protected readonly copied = signal(false);
  /** A row's value, or "not determined (O(q^k))" (honest rows). */
  protected readonly valueText = rowValueText;
  /** passes / fails / waived / not compared (older documents' green / red read as such). */

  /** The stored spec as labelled lines. */
  protected definition(doc: PublicDatasetDto['document']) {
    return gasDefinition(doc.snapshot.spec as unknown as Parameters<typeof gasDefinition>[0]);
  }

  /** One sentence of what is known: orders, determined rows, checks passed. */
  protected knownText(doc: PublicDatasetDto['document']): string {
    const r = { ...doc.snapshot.result, spec: doc.snapshot.spec } as unknown as Parameters<
      typeof knownSentence
    >[0];
    const rows = doc.snapshot.result.canonical;
    const determined = rows.filter(
      (c) => (c as { determined?: boolean }).determined !== false,
    ).length;
    const checks = doc.checks ?? [];
    const count = (status: string) =>
      checks.filter((c) => checkStatusText(c.status) === status).length;
    const verdicts = checks.length
      ? `; checks: ${count('passes')} passes, ${count('fails')} fails, ${count('waived')} waived of ${checks.length}`
      : '; no checks were stated';
    const known = knownSentence(r);
    return `Z(N) for N = 0 to ${rows.length - 1} (${determined} of ${rows.length} rows determined): ${known}${verdicts}.`;
  }

  protected jsonPath(hash: string): string {
    return this.exportPath(hash, 'json');
  }

  protected exportPath(hash: string, format: 'json' | 'csv' | 'latex'): string {
    return `/api/public/datasets/${hash}/export?format=${format}`;
  }

  /** The citation as a BibTeX entry or a CSL-JSON item (authors, public address, hash). */
  protected citationPath(hash: string, format: 'bibtex' | 'csl'): string {
    return `/api/public/datasets/${hash}/citation?format=${format}`;
  }

  protected copy(text: string): void {
    void navigator.clipboard?.writeText(text).then(
      () => this.copied.set(true),
      () => {},
    );
  }
}
