import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { FLOAT_TYPE, TIMESTAMP_TYPE } from './column-types';

/** A repeated REF→GM reading for examiner calibration (pairs: same site, same day). */
@Entity('calibration_reading')
@Index('IDX_calibration_site_day', ['siteId', 'measuredOn'])
export class CalibrationReading {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Column('integer', { name: 'site_id' })
  siteId!: number;

  @Column('integer', { name: 'examiner_id' })
  examinerId!: number;

  @Column('varchar', { name: 'measured_on', length: 10 })
  measuredOn!: string;

  @Column(FLOAT_TYPE, { name: 'ref_gm' })
  refGm!: number;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;
}
