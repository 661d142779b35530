import { httpResource } from '@angular/common/http';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { messageOf } from '../core/api-error';
import { StudyDto } from '@traceloom/shared/api';
import { canCreateStudy } from '../core/roles';
import { Session } from '../core/session';
import { StudyCreateDialog } from './study-create-dialog';

/** The studies the user owns or belongs to, with a button to start a new one. */
@Component({
  selector: 'tl-study-list',
  imports: [DatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './study-list.html',
  styleUrl: './study-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyList {
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly session = inject(Session);

  protected readonly studies = httpResource<StudyDto[]>(() => '/api/studies', {
    defaultValue: [],
  });
  /** The loaded list; empty while loading or after an error (value() throws then). */
  protected readonly list = computed(() => (this.studies.hasValue() ? this.studies.value() : []));
  protected readonly errorMessage = computed(() => {
    const error = this.studies.error();
    return error ? messageOf(error) : null;
  });
  protected readonly canCreate = computed(() => canCreateStudy(this.session.role()));

  protected openCreate(): void {
    this.dialog
      .open<StudyCreateDialog, void, StudyDto>(StudyCreateDialog, { autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((study) => {
        if (study) void this.router.navigate(['/studies', study.id]);
      });
  }
}
