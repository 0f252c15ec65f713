import { PlatformFoundation1764640000000 } from './1764640000000-platform-foundation';

/** Migrations in the order they run. Add new ones at the end. */
export const migrations = [PlatformFoundation1764640000000];
