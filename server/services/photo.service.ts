import { createHash, randomUUID } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import type { PhotoView } from '@tidemark/shared';
import { PHOTO_MAX_PIXELS, photoUploadSchema, todayIso } from '@tidemark/shared';
import { Photo } from '../entities/photo.entity';
import { Visit } from '../entities/visit.entity';
import { HttpError } from '../http-error';
import type { PhotoStorage } from '../storage/photo-storage';
import type { CaseService } from './case.service';
import { clinicalAccess } from './clinical-access';
import { mapPhoto } from './clinical-mappers';
import type { OperatorDirectory } from './operator-directory';

type PhotoUpload = z.output<typeof photoUploadSchema>;

/** Accepted formats, decided by content (magic bytes), never by file name or declared type. */
const FORMATS: Record<string, { extension: 'jpg' | 'png' | 'webp'; encode: (image: sharp.Sharp) => sharp.Sharp }> = {
  'image/jpeg': { extension: 'jpg', encode: (image) => image.jpeg({ quality: 90, mozjpeg: true }) },
  'image/png': { extension: 'png', encode: (image) => image.png({ compressionLevel: 9 }) },
  'image/webp': { extension: 'webp', encode: (image) => image.webp({ quality: 90 }) },
};

const THUMBNAIL_PX = 320;

/** Photographs: checked by content, re-encoded without metadata, stored privately, served by an authorised route. */
export class PhotoService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly cases: CaseService,
    private readonly operators: OperatorDirectory,
    private readonly storage: PhotoStorage,
  ) {}

  async upload(user: Express.User, caseId: number, bytes: Buffer | undefined, fields: PhotoUpload): Promise<PhotoView> {
    await this.cases.findCase(this.dataSource.manager, user, caseId, 'write');
    if (!bytes || bytes.length === 0) throw HttpError.badRequest('Attach a photograph.', { file: 'Attach a JPEG, PNG or WebP file.' });
    const detected = await fileTypeFromBuffer(bytes);
    const format = detected ? FORMATS[detected.mime] : undefined;
    if (!detected || !format) {
      throw new HttpError(415, 'unsupported_media_type', 'Only JPEG, PNG and WebP photographs are accepted (checked by content, not by name).');
    }
    if (fields.visitId !== undefined && !(await this.dataSource.getRepository(Visit).existsBy({ id: fields.visitId, caseId }))) {
      throw HttpError.badRequest('Unknown visit.', { visitId: 'This visit is not part of the case.' });
    }
    const { stored, thumbnail, width, height } = await this.reencode(bytes, format.encode);
    const base = `${caseId}/${randomUUID()}`;
    const storageKey = `${base}.${format.extension}`;
    const thumbnailKey = `${base}-thumb.webp`;
    await this.storage.put(storageKey, stored);
    await this.storage.put(thumbnailKey, thumbnail);
    try {
      const photo = await this.dataSource.getRepository(Photo).save(
        this.dataSource.getRepository(Photo).create({
          caseId,
          visitId: fields.visitId ?? null,
          kind: fields.kind,
          storageKey,
          thumbnailKey,
          contentType: detected.mime,
          bytes: stored.length,
          sha256: createHash('sha256').update(stored).digest('hex'),
          width,
          height,
          uploadedById: user.id,
          monthTaken: fields.monthTaken ?? todayIso().slice(0, 7),
        }),
      );
      return mapPhoto(photo, await this.operators.lookup([user.id]));
    } catch (error) {
      // Keep no orphan files when the row could not be written.
      await this.storage.remove(storageKey);
      await this.storage.remove(thumbnailKey);
      throw error;
    }
  }

  /**
   * Rotates by the EXIF orientation, then re-encodes: sharp writes no EXIF, GPS, XMP or ICC
   * metadata unless asked, and re-encoding disarms anything hidden in the original bytes.
   */
  private async reencode(bytes: Buffer, encode: (image: sharp.Sharp) => sharp.Sharp) {
    try {
      const { data: stored, info } = await encode(sharp(bytes, { limitInputPixels: PHOTO_MAX_PIXELS, failOn: 'error' }).rotate()).toBuffer({ resolveWithObject: true });
      const thumbnail = await sharp(stored).resize({ width: THUMBNAIL_PX, height: THUMBNAIL_PX, fit: 'inside' }).webp({ quality: 75 }).toBuffer();
      return { stored, thumbnail, width: info.width, height: info.height };
    } catch (error) {
      const message = error instanceof Error ? error.message : '';
      if (/pixel limit/i.test(message)) throw new HttpError(413, 'payload_too_large', 'The image has too many pixels (over 60 megapixels).');
      throw new HttpError(415, 'unsupported_media_type', 'The file could not be read as an image.');
    }
  }

  /** The bytes of a photograph (or its thumbnail) for someone allowed to see the case. */
  async read(user: Express.User, id: number, variant: 'full' | 'thumbnail'): Promise<{ bytes: Buffer; contentType: string }> {
    const photo = await this.dataSource.getRepository(Photo).findOneBy({ id });
    if (!photo) {
      // As findCase: roles without patient-level access learn nothing about which records exist.
      clinicalAccess.assertPatientLevel(user);
      throw HttpError.notFound('The photograph');
    }
    await this.cases.findCase(this.dataSource.manager, user, photo.caseId, 'read');
    if (variant === 'thumbnail') return { bytes: await this.storage.get(photo.thumbnailKey), contentType: 'image/webp' };
    return { bytes: await this.storage.get(photo.storageKey), contentType: photo.contentType };
  }
}
