import { LOCALE_ID, Pipe, PipeTransform, inject } from '@angular/core';
import { formatLocalDate, type DateStyle } from './local-date';

/**
 * A date laid out the way the person's locale writes it (`LOCALE_ID`, chosen from the browser's
 * language at start-up): `{{ visit.visitDate | localDate }}`, `{{ sentAt | localDate: 'date-time' }}`.
 */
@Pipe({ name: 'localDate' })
export class LocalDatePipe implements PipeTransform {
  private readonly locale = inject(LOCALE_ID);

  transform(value: string | number | Date | null | undefined, style: DateStyle = 'date', timeZone?: string): string {
    return formatLocalDate(value, style, this.locale, timeZone);
  }
}
