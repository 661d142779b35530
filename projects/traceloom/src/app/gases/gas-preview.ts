import { ChangeDetectionStrategy, Component, effect, inject, input, output } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatIconModule } from '@angular/material/icon';
import type { ComputeResult, GasSpecInput } from '@traceloom/shared/engine';
import {
  Observable,
  catchError,
  debounceTime,
  distinctUntilChanged,
  map,
  of,
  startWith,
  switchMap,
} from 'rxjs';
import { ApiError, messageOf } from '../core/api-error';
import { Tex } from '../shared/tex';
import { valueTex } from '@traceloom/shared/format';
import { GasesApi } from './gases-api';
import { previewSpec } from './gas-validation';

/** What the preview shows: nothing yet, waiting, a result, or the server's objection. */
export type PreviewState =
  | { kind: 'idle' }
  | { kind: 'loading' }
  | { kind: 'done'; result: ComputeResult; spec: GasSpecInput }
  | { kind: 'error'; error: unknown };

/** How long typing must pause before the preview asks the server. */
export const PREVIEW_DEBOUNCE_MS = 400;

/**
 * Runs the preview as the spec changes: debounced, and `switchMap` so a request still in flight is
 * cancelled when a newer spec supersedes it.
 */
export function previewStream(
  specs: Observable<GasSpecInput | null>,
  compute: (spec: GasSpecInput) => Observable<ComputeResult>,
): Observable<PreviewState> {
  return specs.pipe(
    debounceTime(PREVIEW_DEBOUNCE_MS),
    map((spec) => (spec ? previewSpec(spec) : null)),
    distinctUntilChanged((a, b) => JSON.stringify(a) === JSON.stringify(b)),
    switchMap((spec): Observable<PreviewState> => {
      if (!spec) return of({ kind: 'idle' });
      return compute(spec).pipe(
        map((result): PreviewState => ({ kind: 'done', result, spec })),
        catchError((error: unknown) => of<PreviewState>({ kind: 'error', error })),
        startWith<PreviewState>({ kind: 'loading' }),
      );
    }),
  );
}

/** The live preview beside the editor: the first cycle weights and Z(1..3), typeset. */
@Component({
  selector: 'tl-gas-preview',
  imports: [MatProgressBarModule, MatIconModule, Tex],
  templateUrl: './gas-preview.html',
  styleUrl: './gas-preview.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GasPreview {
  private readonly api = inject(GasesApi);

  /** The spec to preview, or null while the form is invalid. */
  readonly spec = input<GasSpecInput | null>(null);
  /** The preview's error (or null once it succeeds), so the editor can mark the field. */
  readonly problem = output<ApiError | null>();

  protected readonly state = toSignal(
    previewStream(toObservable(this.spec), (s) => this.api.compute(s)),
    { initialValue: { kind: 'idle' } as PreviewState },
  );

  protected readonly messageOf = messageOf;
  protected readonly valueTex = valueTex;

  constructor() {
    effect(() => {
      const s = this.state();
      if (s.kind === 'done') this.problem.emit(null);
      if (s.kind === 'error') this.problem.emit(s.error instanceof ApiError ? s.error : null);
    });
  }

  protected variable(s: PreviewState): string {
    return s.kind === 'done' ? (s.spec.variable ?? 'q') : 'q';
  }
}
