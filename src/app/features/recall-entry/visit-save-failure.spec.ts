import { HttpErrorResponse } from '@angular/common/http';
import { readVisitSaveFailure } from './visit-save-failure';

const failure = (status: number, error: unknown) => new HttpErrorResponse({ status, error, url: '/api/visits/3' });

describe('readVisitSaveFailure', () => {
  it('recognises the server asking to confirm a large change', () => {
    const result = readVisitSaveFailure(
      failure(400, {
        error: {
          code: 'validation',
          message: 'More than 3 mm change since the last reading. Check the reference point and confirm.',
          fields: { 'measurements.1.refGm': 'Changed 4 mm since 10 mm — check the reference point, then confirm.' },
          details: { needsConfirmation: true },
        },
      }),
    );
    expect(result).toEqual({
      kind: 'needs-confirmation',
      message: 'More than 3 mm change since the last reading. Check the reference point and confirm.',
      fields: { 'measurements.1.refGm': 'Changed 4 mm since 10 mm — check the reference point, then confirm.' },
    });
  });

  it('treats plain validation as field errors', () => {
    const result = readVisitSaveFailure(
      failure(400, { error: { code: 'validation', message: 'Some fields need attention.', fields: { reason: 'Say why.' } } }),
    );
    expect(result).toEqual({ kind: 'fields', message: 'Some fields need attention.', fields: { reason: 'Say why.' } });
  });

  it('reads the current version of a stale correction', () => {
    const result = readVisitSaveFailure(
      failure(409, { error: { code: 'conflict', message: 'Changed by someone else.', details: { currentVersion: 4 } } }),
    );
    expect(result).toEqual({ kind: 'stale', message: 'Changed by someone else.', currentVersion: 4 });
  });

  it('says something human for anything else', () => {
    expect(readVisitSaveFailure(failure(500, null))).toMatchObject({ kind: 'other', message: expect.stringMatching(/server/) });
    expect(readVisitSaveFailure(new Error('boom'))).toEqual({ kind: 'other', message: 'The recall could not be saved. Try again.' });
  });
});
