import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { SyntaxLink } from '../shared/syntax-link';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ApiError, messageOf } from '../core/api-error';
import { ChecksApi, ReferenceDto, ReferenceFields, ReferencePreview } from './checks-api';

/** Largest upload the API accepts (API contract: 10 MB). */
export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;

/**
 * Upload of a reference table: drop a CSV/JSON file (or choose it), state its normalization, see
 * the server's parse of every row and the row-level errors (dry run), then save.
 */
@Component({
  selector: 'tl-reference-upload',
  imports: [
    SyntaxLink,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
  ],
  templateUrl: './reference-upload.html',
  styleUrl: './reference-upload.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReferenceUpload {
  private readonly api = inject(ChecksApi);

  readonly studyId = input.required<string>();
  /** The variable of the gas being checked (the default for the table). */
  readonly variable = input('q');
  readonly saved = output<ReferenceDto>();

  protected readonly fields = new FormGroup({
    title: new FormControl('', { nonNullable: true }),
    normalization: new FormControl('1', { nonNullable: true }),
    variable: new FormControl('', { nonNullable: true }),
    note: new FormControl('', { nonNullable: true }),
  });
  protected readonly file = signal<File | null>(null);
  protected readonly dragging = signal(false);
  protected readonly busy = signal(false);
  protected readonly preview = signal<ReferencePreview | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly jsonExample = '{"rows": [{"N": 2, "value": "q + O(q^6)"}]}';

  protected onDragOver(event: DragEvent): void {
    event.preventDefault();
    if (event.dataTransfer) event.dataTransfer.dropEffect = 'copy';
    this.dragging.set(true);
  }

  protected onDrop(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(false);
    const file = event.dataTransfer?.files?.[0];
    if (file) this.choose(file);
  }

  protected onPicked(input: HTMLInputElement): void {
    const file = input.files?.[0];
    if (file) this.choose(file);
    input.value = '';
  }

  /** Takes a file and asks the server for its dry-run parse. */
  choose(file: File): void {
    this.error.set(null);
    this.preview.set(null);
    if (file.size === 0) {
      this.file.set(null);
      this.error.set(`The file is empty: "${file.name}" has no bytes.`);
      return;
    }
    if (file.size > MAX_UPLOAD_BYTES) {
      this.file.set(null);
      this.error.set(`The file is ${(file.size / 1048576).toFixed(1)} MB; the limit is 10 MB.`);
      return;
    }
    this.file.set(file);
    if (!this.fields.controls.title.value) {
      this.fields.controls.title.setValue(file.name.replace(/\.(csv|json)$/i, ''));
    }
    this.runPreview();
  }

  protected runPreview(): void {
    const file = this.file();
    if (!file) return;
    this.busy.set(true);
    this.api.preview(this.studyId(), file, this.values()).subscribe({
      next: (preview) => {
        this.busy.set(false);
        this.preview.set(preview);
      },
      error: (err: unknown) => this.fail(err),
    });
  }

  protected save(): void {
    const file = this.file();
    if (!file) return;
    this.busy.set(true);
    this.api.upload(this.studyId(), file, this.values()).subscribe({
      next: (reference) => {
        this.busy.set(false);
        this.saved.emit(reference);
        this.file.set(null);
        this.preview.set(null);
        this.fields.reset({ title: '', normalization: '1', variable: '', note: '' });
      },
      error: (err: unknown) => this.fail(err),
    });
  }

  private values(): ReferenceFields {
    const v = this.fields.getRawValue();
    return { ...v, variable: v.variable || this.variable() };
  }

  private fail(err: unknown): void {
    this.busy.set(false);
    const name = err instanceof ApiError ? err.field?.split('.').pop() : undefined;
    const control = name && name !== 'file' ? this.fields.get(name) : null;
    if (control && err instanceof ApiError) {
      // The server's message starts with the field's name, which the form shows already.
      const message = err.message.replace(new RegExp(`^${name}: `), '');
      control.setErrors({ server: message });
      control.markAsTouched();
      this.error.set(null);
    } else {
      this.error.set(messageOf(err));
    }
  }
}
