import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import { OutboxEntry, ScheduleRun } from './outbox-entry';

/** HTTP calls of the Outbox page: `/api/outbox` (admin only). Failures go to the global notice. */
@Injectable({ providedIn: 'root' })
export class OutboxApi {
  private readonly http = inject(HttpClient);

  /** The latest messages, newest first. */
  list(): Observable<OutboxEntry[]> {
    return this.http.get<OutboxEntry[]>('/api/outbox');
  }

  /** Puts a queued or failed message back in line and delivers what is due; 409 if it was already sent. */
  retry(id: number): Observable<OutboxEntry> {
    return this.http.post<OutboxEntry>(`/api/outbox/${encodeURIComponent(id)}/retry`, null);
  }

  /** Queues this week's recall round-ups and action nudges, then delivers what is due. */
  runSchedules(): Observable<ScheduleRun> {
    return this.http.post<ScheduleRun>('/api/outbox/run', null);
  }
}
