import { HttpErrorResponse } from '@angular/common/http';
import { failureSentence } from './failure-sentence';

const failure = (status: number, error: unknown) => new HttpErrorResponse({ status, error, url: '/api/x' });

describe('failureSentence', () => {
  it("uses the server's sentence for a refusal", () => {
    expect(failureSentence(failure(403, { error: { code: 'forbidden', message: 'The audit lead sends the governance pack.' } }))).toBe(
      'The audit lead sends the governance pack.',
    );
  });

  it('uses our sentence for a server fault and an unreachable server', () => {
    expect(failureSentence(failure(500, { error: { code: 'internal', message: 'Something went wrong on our side.' } }))).toMatch(/^Something went wrong on the server/);
    expect(failureSentence(failure(0, null))).toMatch(/can't reach the server/);
  });

  it('falls back for anything that is not an HTTP failure', () => {
    expect(failureSentence(new Error('boom'), 'The workbook could not be built.')).toBe('The workbook could not be built.');
  });
});
