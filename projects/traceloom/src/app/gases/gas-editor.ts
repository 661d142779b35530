import { StudyCrumb } from '../shared/study-crumb';
import { RunEstimate } from '../runs/run-estimate';
import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  effect,
  inject,
  Injector,
  input,
  linkedSignal,
  signal,
  untracked,
} from '@angular/core';
import { DatePipe } from '@angular/common';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import type { GasSpecInput } from '@traceloom/shared/engine';
import { ApiError, messageOf } from '../core/api-error';
import { Session } from '../core/session';
import { AsyncState, type ResourceLike } from '../shared/async-state';
import { canWriteGases } from '../core/gas-roles';
import { GasRuns } from '../runs/gas-runs';
import { errorText } from './field-error';
import { clearDraft, draftKey, GasDraft, readDraft, writeDraft } from './gas-draft';
import { applyFieldErrors, controlPathFor, fillGasForm, gasForm, specFromForm } from './gas-form';
import { GasNumericFields } from './gas-numeric-fields';
import { GasSectorsFields } from './gas-sectors-fields';
import { GasPreview } from './gas-preview';
import { specProblems } from './gas-validation';
import { GasVersions } from './gas-versions';
import { GasDto, GasesApi } from './gases-api';
import { GasWeights } from './gas-weights';

/**
 * Define or edit a gas: the spec as a reactive form checked by the shared schema as you type, a
 * live preview, saving as a new version, the version history, and runs of the saved version.
 */
@Component({
  selector: 'tl-gas-editor',
  imports: [
    AsyncState,
    StudyCrumb,
    RunEstimate,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    RouterLink,
    GasNumericFields,
    GasSectorsFields,
    GasPreview,
    GasRuns,
    GasVersions,
    GasWeights,
    DatePipe,
  ],
  templateUrl: './gas-editor.html',
  styleUrl: './gas-editor.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GasEditor {
  private readonly api = inject(GasesApi);
  private readonly session = inject(Session);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);
  private readonly injector = inject(Injector);

  /** Route `studies/:studyId/gases/new`: the study a new gas goes into. */
  readonly studyId = input<string>();
  /** Route `gases/:gasId`: the gas to edit. */
  readonly gasId = input<string>();

  protected readonly form = gasForm();
  /** The saved gas as read; idle for a new gas. A new id cancels the previous request. */
  private readonly gasRead = this.api.gasResource(() => this.gasId());
  /** The gas on screen: as read, then as saved. */
  protected readonly gas = linkedSignal<GasDto | null>(() =>
    this.gasRead.hasValue() ? this.gasRead.value() : null,
  );
  /** The read as the page's state: a new gas has nothing to wait for. */
  protected readonly gasState: ResourceLike = {
    isLoading: () => this.gasRead.isLoading(),
    hasValue: () => this.isNew() || this.gasRead.hasValue(),
    error: () => this.gasRead.error(),
  };
  /** The older version asked for (null: none); read through a resource. */
  private readonly requestedVersion = signal<number | null>(null);
  private readonly versionRead = this.api.versionResource(
    () => this.gas()?.id,
    () => this.requestedVersion(),
  );
  protected readonly loading = computed(() => this.versionRead.isLoading());
  protected readonly saving = signal(false);
  protected readonly saveError = signal<string | null>(null);
  /** A version other than the latest, shown read-only; null = the latest (editable). */
  protected readonly viewedVersion = signal<number | null>(null);
  protected readonly otherProblems = signal<string[]>([]);
  /** The valid spec the preview follows, or null while the form has problems. */
  protected readonly previewInput = signal<GasSpecInput | null>(null);

  protected readonly canWrite = computed(() => canWriteGases(this.session.role()));
  protected readonly readOnly = computed(() => !this.canWrite() || this.viewedVersion() !== null);
  protected readonly isNew = computed(() => !this.gasId());
  protected readonly backLink = computed(() => {
    const study = this.gas()?.studyId ?? this.studyId();
    return study ? ['/studies', study] : ['/studies'];
  });
  protected readonly errorText = errorText;
  /** The unsaved draft restored into the form, while its notice shows. */
  protected readonly restoredDraft = signal<GasDraft | null>(null);
  private readonly draftKey = computed(() => draftKey(this.gasId(), this.studyId()));

  constructor() {
    this.form.valueChanges.pipe(takeUntilDestroyed(this.destroyRef)).subscribe(() => {
      this.validate();
      this.keepDraft();
    });
    // A new gas: the draft kept in the browser, if any, goes into the form.
    effect(() => {
      if (!this.gasId())
        queueMicrotask(() => {
          this.restoreDraft();
          this.validate();
        });
    });
    // The saved gas as read goes into the form (then the draft kept over it, if any).
    effect(() => {
      if (!this.gasRead.hasValue()) return;
      const gas = this.gasRead.value();
      untracked(() => this.fill(gas));
    });
    // An older version as read goes into the form, read-only; a failed read says why.
    effect(() => {
      const err = this.versionRead.error();
      const old = this.versionRead.hasValue() ? this.versionRead.value() : undefined;
      untracked(() => {
        if (err) {
          this.requestedVersion.set(null);
          this.snackBar.open(messageOf(err), 'Dismiss', { duration: 6000 });
        } else if (old) {
          this.viewedVersion.set(old.version);
          fillGasForm(this.form, old.spec);
        }
      });
    });
    effect(() => (this.readOnly() ? this.form.disable() : this.form.enable()));
  }

  /** Checks the form with the shared schema and puts each problem under its field. */
  protected validate(): void {
    const value = this.form.getRawValue();
    const spec = specFromForm(value);
    const problems = specProblems(spec, value.weightsKind);
    applyFieldErrors(this.form, 'schema', problems.byControl);
    this.otherProblems.set(problems.other);
    const clean =
      problems.byControl.size === 0 && problems.other.length === 0 && !this.hasRequiredGaps();
    this.previewInput.set(clean ? spec : null);
    // A refusal that no longer applies goes away once its cause is fixed.
    if (clean && this.form.valid) this.saveError.set(null);
  }

  /** Discards the restored draft: the form shows the saved gas (or an empty one) again. */
  protected discardDraft(): void {
    clearDraft(this.draftKey());
    this.restoredDraft.set(null);
    const gas = this.gas();
    if (gas) fillGasForm(this.form, gas.spec);
    else this.form.reset();
    this.form.markAsPristine();
  }

  /** Writes the form to the browser's storage while it has unsaved changes. */
  private keepDraft(): void {
    if (!this.form.dirty || this.readOnly()) return;
    writeDraft(this.draftKey(), {
      spec: specFromForm(this.form.getRawValue()),
      savedAt: new Date().toISOString(),
      baseVersion: this.gas()?.version ?? null,
    });
  }

  /** Puts a stored draft into the form (after the saved gas, if any, was filled in). */
  private restoreDraft(): void {
    const draft = readDraft(this.draftKey());
    if (!draft || this.readOnly()) return;
    fillGasForm(this.form, draft.spec);
    this.form.markAsDirty();
    this.restoredDraft.set(draft);
  }

  /** Shows a preview failure that names a field on that field (as the server's message). */
  protected onPreviewProblem(error: ApiError | null): void {
    const messages = new Map<string, string>();
    const path = error?.field
      ? controlPathFor(error.field, this.form.getRawValue().weightsKind)
      : null;
    if (error && path) messages.set(path, error.message);
    applyFieldErrors(this.form, 'server', messages, true);
  }

  protected save(): void {
    this.validate();
    if (this.form.invalid || this.otherProblems().length > 0) {
      this.form.markAllAsTouched();
      this.saveError.set('Some fields need attention; each says what is wrong.');
      return;
    }
    const spec = specFromForm(this.form.getRawValue());
    const gas = this.gas();
    const studyId = this.studyId();
    const request = gas
      ? this.api.update(gas.id, spec)
      : studyId
        ? this.api.create(studyId, spec)
        : null;
    if (!request) return;
    this.saving.set(true);
    this.saveError.set(null);
    request.subscribe({
      next: (saved) => {
        this.saving.set(false);
        this.gas.set(saved);
        this.form.markAsPristine();
        clearDraft(this.draftKey());
        this.restoredDraft.set(null);
        this.snackBar.open(`Saved as version ${saved.version}.`, undefined, { duration: 3000 });
        if (!gas) void this.router.navigate(['/gases', saved.id], { state: { showRuns: true } });
        else this.showRuns();
      },
      error: (err: unknown) => {
        this.saving.set(false);
        const path =
          err instanceof ApiError && err.field
            ? controlPathFor(err.field, this.form.getRawValue().weightsKind)
            : null;
        if (err instanceof ApiError && path && this.form.get(path)) {
          applyFieldErrors(this.form, 'server', new Map([[path, err.message]]), true);
          this.saveError.set('The server refused one field; see the message under it.');
        } else {
          this.saveError.set(messageOf(err));
        }
      },
    });
  }

  /** Shows an old version read-only (null: back to the latest, editable). */
  protected viewVersion(version: number | null): void {
    const gas = this.gas();
    if (!gas) return;
    if (version === null || version === gas.version) {
      this.requestedVersion.set(null);
      this.viewedVersion.set(null);
      fillGasForm(this.form, gas.spec);
      this.form.markAsPristine();
      return;
    }
    this.requestedVersion.set(version);
  }

  private fill(gas: GasDto): void {
    this.viewedVersion.set(null);
    fillGasForm(this.form, gas.spec);
    this.form.markAsPristine();
    this.restoreDraft();
    if ((history.state as { showRuns?: boolean } | null)?.showRuns) this.showRuns();
  }

  /** After a save: the runs of the saved version, with the Run button, come into view. */
  private showRuns(): void {
    afterNextRender(
      () => {
        const runs = document.getElementById('runs');
        runs?.scrollIntoView({ block: 'start' });
        runs
          ?.querySelector<HTMLElement>('[data-testid="run-start"]')
          ?.focus({ preventScroll: true });
      },
      { injector: this.injector },
    );
  }

  private hasRequiredGaps(): boolean {
    const check = (c: { hasError(k: string): boolean }) => c.hasError('required');
    const f = this.form.controls;
    // Numeric mode has no step; a missing precision is the shared schema's finding.
    const mode = f.numeric.value ? [] : [f.step];
    return [f.title, f.variable, f.nMax, ...mode].some(check);
  }
}
