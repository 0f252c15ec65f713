/** Why a restore was refused (nothing was changed). */
export type RestoreRefusal =
  | 'missing'
  | 'same-file'
  | 'not-sqlite'
  | 'damaged'
  | 'not-tidemark'
  | 'newer-schema'
  | 'in-use'
  | 'photos-missing'
  | 'photos-damaged'
  | 'uploads-mount';

/** A restore refused before the live database or the uploads folder was touched; the message is one sentence for people. */
export class RestoreRefusedError extends Error {
  constructor(
    readonly reason: RestoreRefusal,
    message: string,
  ) {
    super(message);
    this.name = 'RestoreRefusedError';
  }
}
