import { PlatformFoundation1764640000000 } from './1764640000000-platform-foundation';
import { ClinicalRecords1764700000000 } from './1764700000000-clinical-records';
import { Audits1764800000000 } from './1764800000000-audits';
import { Mail1764900000000 } from './1764900000000-mail';
import { SecondFactor1765200000000 } from './1765200000000-second-factor';

/** Migrations in the order they run. Add new ones at the end. */
export const migrations = [PlatformFoundation1764640000000, ClinicalRecords1764700000000, Audits1764800000000, Mail1764900000000, SecondFactor1765200000000];
