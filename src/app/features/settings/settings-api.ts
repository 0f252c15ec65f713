import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { BackupTaken, SystemOverview } from '@tidemark/shared';
import { Observable } from 'rxjs';
import { showsOwnErrors } from '../../core/http/shows-own-errors';

/** HTTP calls of the Settings page: `/api/settings` (administrator only). */
@Injectable({ providedIn: 'root' })
export class SettingsApi {
  private readonly http = inject(HttpClient);

  /** How this installation keeps records, photographs and mail, its sign-in rules and its backups. */
  systemOverview(): Observable<SystemOverview> {
    return this.http.get<SystemOverview>('/api/settings/system');
  }

  /**
   * Takes a checked backup of the SQLite file now. The backups panel says itself why one
   * failed (409 on PostgreSQL, or while another backup runs).
   */
  takeBackup(): Observable<BackupTaken> {
    return this.http.post<BackupTaken>('/api/settings/backups', null, { context: showsOwnErrors() });
  }
}
