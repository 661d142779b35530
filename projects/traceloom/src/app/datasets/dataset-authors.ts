import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
  output,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import type { DatasetDto, DatasetPersonDto, StudyDto } from '@traceloom/shared/api';
import { messageOf } from '../core/api-error';
import { DatasetsApi } from './datasets-api';

/**
 * The citation's authors of a dataset: the list a lock freezes, in order. Its maker or a steward
 * may change it until the lock (add a study member, move one up or down, remove one, save).
 */
@Component({
  selector: 'tl-dataset-authors',
  imports: [MatButtonModule, MatFormFieldModule, MatIconModule, MatSelectModule],
  templateUrl: './dataset-authors.html',
  styleUrl: './dataset-authors.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DatasetAuthors {
  private readonly api = inject(DatasetsApi);

  readonly dataset = input.required<DatasetDto>();
  /** The dataset's study: its owner and members are who may be named. */
  readonly study = input<StudyDto | null>(null);
  /** The dataset as the server answered after a change. */
  readonly changed = output<DatasetDto>();

  protected readonly editing = signal(false);
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  /** The list being edited; starts from the dataset's authors each time they change. */
  /** The two move buttons of an author row, up then down. */
  protected readonly moves = [
    { by: -1, word: 'up', icon: 'arrow_upward' },
    { by: 1, word: 'down', icon: 'arrow_downward' },
  ] as const;

  protected readonly draft = linkedSignal<DatasetPersonDto[]>(() => [...this.dataset().authors]);

  /** Study people not yet in the list. */
  protected readonly addable = computed(() => {
    const s = this.study();
    if (!s) return [];
    const named = new Set(this.draft().map((a) => a.id));
    const people = [s.owner, ...s.members.filter((m) => m.id !== s.owner.id)];
    return people
      .filter((p) => !named.has(p.id))
      .map((p) => ({ id: p.id, displayName: p.displayName }));
  });

  protected names(list: DatasetPersonDto[]): string {
    return list.map((a) => a.displayName).join(', ');
  }

  protected start(): void {
    this.draft.set([...this.dataset().authors]);
    this.error.set(null);
    this.editing.set(true);
  }

  protected add(p: DatasetPersonDto | null): void {
    if (p) this.draft.update((list) => [...list, p]);
  }

  protected move(index: number, by: -1 | 1): void {
    this.draft.update((list) => {
      const next = [...list];
      const [item] = next.splice(index, 1);
      next.splice(index + by, 0, item!);
      return next;
    });
  }

  protected removeAt(index: number): void {
    this.draft.update((list) => list.filter((_, i) => i !== index));
  }

  protected save(): void {
    const ids = this.draft().map((a) => a.id);
    if (ids.length === 0) {
      this.error.set('Name at least one author.');
      return;
    }
    this.busy.set(true);
    this.error.set(null);
    this.api.update(this.dataset().id, { authors: ids }).subscribe({
      next: (d) => {
        this.busy.set(false);
        this.editing.set(false);
        this.changed.emit(d);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(messageOf(err));
      },
    });
  }
}
