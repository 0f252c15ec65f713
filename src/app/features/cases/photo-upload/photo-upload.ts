import { HttpErrorResponse, HttpEventType } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, inject, input, output, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, ValidatorFn } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { PHOTO_KINDS, PHOTO_KIND_LABELS, PHOTO_MAX_BYTES, photoUploadSchema, type PhotoKind, type PhotoView, type VisitView } from '@tidemark/shared';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { CasesApi } from '../cases-api';

/** The file types the server accepts (it checks the content; this only narrows the picker). */
export const ACCEPTED_PHOTO_TYPES = 'image/jpeg,image/png,image/webp';

/** The upload form's controls (the file itself is kept apart: it is not a form value). */
interface PhotoUploadForm {
  kind: FormControl<PhotoKind>;
  visitId: FormControl<number | null>;
  monthTaken: FormControl<string>;
}

/** Picks a photograph and sends it with a determinate progress bar, explaining any refusal. */
@Component({
  selector: 'tm-photo-upload',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './photo-upload.html',
  styleUrl: './photo-upload.scss',
})
export class PhotoUpload {
  private readonly api = inject(CasesApi);
  private readonly destroyRef = inject(DestroyRef);
  private readonly fileInput = viewChild.required<ElementRef<HTMLInputElement>>('fileInput');

  readonly caseId = input.required<number>();
  readonly visits = input<readonly VisitView[]>([]);
  /** Emits the stored photograph once the server has checked and kept it. */
  readonly uploaded = output<PhotoView>();

  protected readonly kinds = PHOTO_KINDS;
  protected readonly kindLabels = PHOTO_KIND_LABELS;
  protected readonly accept = ACCEPTED_PHOTO_TYPES;
  protected readonly maxMegabytes = PHOTO_MAX_BYTES / (1024 * 1024);
  protected readonly fieldMessage = fieldMessage;

  protected readonly form = new FormGroup<PhotoUploadForm>({
    kind: new FormControl<PhotoKind>('recall', { nonNullable: true }),
    visitId: new FormControl<number | null>(null),
    monthTaken: new FormControl('', { nonNullable: true, validators: unlessEmpty(zodValidator(photoUploadSchema.shape.monthTaken)) }),
  });

  protected readonly file = signal<File | null>(null);
  protected readonly isUploading = signal(false);
  /** Percent sent, or null while the size is unknown (indeterminate bar). */
  protected readonly progress = signal<number | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly confirmation = signal<string | null>(null);

  protected chooseFile(files: FileList | null): void {
    const file = files?.item(0) ?? null;
    this.failure.set(null);
    this.confirmation.set(null);
    this.progress.set(null);
    if (file && file.size > PHOTO_MAX_BYTES) {
      // Saves sending 15 MB only to hear the server refuse it.
      this.failure.set(`That file is ${megabytes(file.size)}; photographs up to ${this.maxMegabytes} MB are accepted.`);
      this.file.set(null);
      this.fileInput().nativeElement.value = '';
      return;
    }
    this.file.set(file);
  }

  protected uploadPhoto(): void {
    const file = this.file();
    if (!file || this.isUploading()) {
      return;
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    this.failure.set(null);
    this.confirmation.set(null);
    this.progress.set(0);
    this.isUploading.set(true);
    this.api
      .uploadPhoto(this.caseId(), { file, fileName: file.name, kind: value.kind, visitId: value.visitId, monthTaken: value.monthTaken || null })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (event) => {
          if (event.type === HttpEventType.UploadProgress) {
            this.progress.set(event.total ? Math.round((100 * event.loaded) / event.total) : null);
          } else if (event.type === HttpEventType.Response && event.body) {
            this.finish(event.body, file.name);
          }
        },
        error: (error: unknown) => {
          this.isUploading.set(false);
          this.progress.set(null);
          this.failure.set(refusal(error));
        },
      });
  }

  private finish(photo: PhotoView, name: string): void {
    this.isUploading.set(false);
    this.progress.set(null);
    this.file.set(null);
    this.fileInput().nativeElement.value = '';
    this.confirmation.set(`${name} was uploaded as “${PHOTO_KIND_LABELS[photo.kind]}”.`);
    this.uploaded.emit(photo);
  }
}

/** The sentence for a refused upload: the server's own words where it gave a reason. */
function refusal(error: unknown): string {
  if (!(error instanceof HttpErrorResponse)) {
    return 'The photograph could not be uploaded. Try again.';
  }
  const details = apiErrorDetails(error);
  // 413/415/400 carry the specific reason (size, real content type, a bad field).
  if (details && (error.status === 413 || error.status === 415 || error.status === 400)) {
    const fields = Object.values(details.fields ?? {});
    return [details.message, ...fields].join(' ');
  }
  return describeHttpError(error);
}

function megabytes(bytes: number): string {
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

/** Runs `validator` only when the field has something in it. */
function unlessEmpty(validator: ValidatorFn): ValidatorFn {
  return (control) => (control.value === '' ? null : validator(control));
}
