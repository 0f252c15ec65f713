import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { FLOAT_TYPE } from './column-types';
import type { ReferencePoint, SiteLocation } from '@tidemark/shared';

/** A measured site of a case: one tooth and location, with baseline and surgical readings (mm). */
@Entity('site')
@Index('UQ_site_case_tooth_location', ['caseId', 'tooth', 'location'], { unique: true })
export class Site {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Column('integer', { name: 'case_id' })
  caseId!: number;

  /** FDI two-digit tooth number (ISO 3950). */
  @Column('integer')
  tooth!: number;

  @Column('varchar', { length: 16 })
  location!: SiteLocation;

  @Column('varchar', { name: 'reference_point', length: 20 })
  referencePoint!: ReferencePoint;

  @Column(FLOAT_TYPE, { name: 'baseline_ref_gm' })
  baselineRefGm!: number;

  @Column(FLOAT_TYPE, { name: 'probing_depth', nullable: true })
  probingDepth!: number | null;

  @Column(FLOAT_TYPE, { name: 'kt_width', nullable: true })
  ktWidth!: number | null;

  @Column(FLOAT_TYPE, { name: 'margin_to_crest', nullable: true })
  marginToCrest!: number | null;

  @Column('integer', { name: 'papilla_score', nullable: true })
  papillaScore!: number | null;

  @Column(FLOAT_TYPE, { name: 'planned_excision', nullable: true })
  plannedExcision!: number | null;

  @Column(FLOAT_TYPE, { name: 'post_op_ref_gm', nullable: true })
  postOpRefGm!: number | null;

  @Column('integer', { default: 1 })
  version!: number;
}
