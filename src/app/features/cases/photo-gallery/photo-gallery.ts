import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { PHOTO_KIND_LABELS, type PhotoView, type VisitView } from '@tidemark/shared';
import { photoThumbnailUrl } from '../cases-api';
import { PhotoUpload } from '../photo-upload/photo-upload';
import { PhotoViewer, type PhotoViewerData } from '../photo-viewer/photo-viewer';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** A photograph with its caption worked out once. */
interface PhotoTile {
  readonly photo: PhotoView;
  readonly kind: string;
  readonly thumbnail: string;
  readonly visitLabel: string | null;
}

/** The case's photographs as thumbnails; a tap opens the full image. Writers can add more. */
@Component({
  selector: 'tm-photo-gallery',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatIconModule, PhotoUpload],
  template: `
    @if (canWrite()) {
      <tm-photo-upload [caseId]="caseId()" [visits]="visits()" (uploaded)="uploaded.emit($event)" />
    }
    @if (tiles().length === 0) {
      <p class="empty">
        No photographs have been uploaded for this case.{{ canWrite() ? ' Add one above with Choose photograph, then Upload.' : '' }}
      </p>
    } @else {
      <ul class="tiles">
        @for (tile of tiles(); track tile.photo.id) {
          <li>
            <button type="button" class="tile" (click)="openPhoto(tile.photo)">
              <img [src]="tile.thumbnail" [alt]="tile.kind + ', ' + tile.photo.monthTaken" loading="lazy" />
              <span class="caption">
                <strong>{{ tile.kind }}</strong>
                <span>{{ tile.photo.monthTaken | localDate: 'month' }}{{ tile.visitLabel ? ' · ' + tile.visitLabel : '' }}</span>
              </span>
            </button>
          </li>
        }
      </ul>
    }
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 20px;
    }
    .empty {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
    .tiles {
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(180px, 1fr));
      gap: 16px;
      margin: 0;
      padding: 0;
      list-style: none;
    }
    .tile {
      display: flex;
      flex-direction: column;
      width: 100%;
      padding: 0;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-medium);
      overflow: hidden;
      background: var(--mat-sys-surface-container-lowest);
      color: inherit;
      font: inherit;
      text-align: start;
      cursor: zoom-in;
    }
    .tile:hover {
      border-color: var(--mat-sys-primary);
    }
    img {
      display: block;
      width: 100%;
      aspect-ratio: 4 / 3;
      object-fit: cover;
      background: var(--mat-sys-surface-container);
    }
    .caption {
      display: flex;
      flex-direction: column;
      padding: 10px 12px;
      font: var(--mat-sys-body-medium);
    }
    .caption span {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class PhotoGallery {
  private readonly dialog = inject(MatDialog);

  readonly caseId = input.required<number>();
  readonly patientCode = input.required<string>();
  readonly photos = input.required<readonly PhotoView[]>();
  readonly visits = input<readonly VisitView[]>([]);
  readonly canWrite = input(false);
  /** Emits each newly stored photograph. */
  readonly uploaded = output<PhotoView>();

  protected readonly tiles = computed<PhotoTile[]>(() =>
    this.photos().map((photo) => {
      const visit = this.visits().find((candidate) => candidate.id === photo.visitId);
      return {
        photo,
        kind: PHOTO_KIND_LABELS[photo.kind],
        thumbnail: photoThumbnailUrl(photo.id),
        visitLabel: visit ? `${visit.intervalLabel} recall` : null,
      };
    }),
  );

  protected openPhoto(photo: PhotoView): void {
    this.dialog.open<PhotoViewer, PhotoViewerData>(PhotoViewer, {
      data: { photo, patientCode: this.patientCode() },
      maxWidth: '96vw',
      width: '960px',
    });
  }
}
