import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { FLOAT_TYPE } from './column-types';

/** One site's readings at one visit (mm). */
@Entity('site_measurement')
@Index('UQ_measurement_visit_site', ['visitId', 'siteId'], { unique: true })
export class SiteMeasurement {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Column('integer', { name: 'visit_id' })
  visitId!: number;

  @Index('IDX_measurement_site')
  @Column('integer', { name: 'site_id' })
  siteId!: number;

  @Column(FLOAT_TYPE, { name: 'ref_gm' })
  refGm!: number;

  @Column(FLOAT_TYPE, { name: 'probing_depth', nullable: true })
  probingDepth!: number | null;

  @Column('boolean', { name: 'bleeding_on_probing', nullable: true })
  bleedingOnProbing!: boolean | null;

  @Column(FLOAT_TYPE, { name: 'kt_width', nullable: true })
  ktWidth!: number | null;

  @Column('integer', { name: 'papilla_score', nullable: true })
  papillaScore!: number | null;
}
