import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { PHOTO_KIND_LABELS, type PhotoView } from '@tidemark/shared';
import { photoUrl } from '../cases-api';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** What the viewer shows. */
export interface PhotoViewerData {
  readonly photo: PhotoView;
  readonly patientCode: string;
}

/** One photograph at full size, with what it shows and when. */
@Component({
  selector: 'tm-photo-viewer',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatDialogModule, MatIconModule],
  template: `
    <h2 mat-dialog-title>{{ kind }} · {{ data.photo.monthTaken | localDate: 'month-long' }}</h2>
    <mat-dialog-content class="content">
      <img [src]="source" [alt]="kind + ', ' + data.patientCode + ', taken ' + data.photo.monthTaken" />
      <p class="meta">
        {{ data.photo.width }} × {{ data.photo.height }} px · uploaded by {{ data.photo.uploadedBy.displayName }}
        on {{ data.photo.createdAt | localDate }}
      </p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <a mat-button [href]="source" target="_blank" rel="noopener">
        <mat-icon aria-hidden="true">open_in_new</mat-icon>
        Open in a new tab
      </a>
      <button mat-flat-button type="button" mat-dialog-close cdkFocusInitial>Close</button>
    </mat-dialog-actions>
  `,
  styles: `
    .content {
      display: flex;
      flex-direction: column;
      align-items: center;
      gap: 8px;
    }
    img {
      display: block;
      max-width: 100%;
      max-height: 70vh;
      object-fit: contain;
      border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-surface-container);
    }
    .meta {
      margin: 0;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
    mat-dialog-actions {
      padding: 8px 24px 20px;
      gap: 8px;
    }
  `,
})
export class PhotoViewer {
  protected readonly data = inject<PhotoViewerData>(MAT_DIALOG_DATA);
  protected readonly kind = PHOTO_KIND_LABELS[this.data.photo.kind];
  protected readonly source = photoUrl(this.data.photo.id);
}
