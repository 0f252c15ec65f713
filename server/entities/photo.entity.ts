import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { PhotoKind } from '@tidemark/shared';
import { TIMESTAMP_TYPE } from './column-types';

/** A clinical photograph, re-encoded without metadata and stored outside any public folder. */
@Entity('photo')
export class Photo {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Index('IDX_photo_case')
  @Column('integer', { name: 'case_id' })
  caseId!: number;

  @Column('integer', { name: 'visit_id', nullable: true })
  visitId!: number | null;

  @Column('varchar', { length: 16 })
  kind!: PhotoKind;

  /** Path relative to the uploads folder; generated, never taken from the client. */
  @Column('varchar', { name: 'storage_key', length: 200 })
  storageKey!: string;

  @Column('varchar', { name: 'thumbnail_key', length: 200 })
  thumbnailKey!: string;

  @Column('varchar', { name: 'content_type', length: 32 })
  contentType!: string;

  @Column('integer')
  bytes!: number;

  @Column('varchar', { length: 64 })
  sha256!: string;

  @Column('integer')
  width!: number;

  @Column('integer')
  height!: number;

  @Column('integer', { name: 'uploaded_by_id' })
  uploadedById!: number;

  /** YYYY-MM: month precision is enough for an audit and keeps dates coarse. */
  @Column('varchar', { name: 'month_taken', length: 7 })
  monthTaken!: string;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;
}
