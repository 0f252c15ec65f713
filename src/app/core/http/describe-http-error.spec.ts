import { HttpErrorResponse } from '@angular/common/http';
import { describeHttpError } from './describe-http-error';

function failure(status: number, error: unknown = null): HttpErrorResponse {
  return new HttpErrorResponse({ status, error, url: '/api/anything' });
}

const body = (code: string, message: string) => ({ error: { code, message } });

describe('describeHttpError', () => {
  it.each([
    [0, "Tidemark can't reach the server. Check the connection and try again."],
    [403, "Your role doesn't allow this action. If you need it, ask the audit lead or an administrator."],
    [404, 'That record could not be found. It may have been removed; reload the page to see what is there now.'],
    [413, 'That file is too large to upload. Choose a smaller one: the size limit is given beside the button.'],
    [415, "That kind of file isn't accepted here. Choose one of the kinds listed beside the button."],
    [500, 'Something went wrong on the server. Try again; if it keeps happening, tell your administrator.'],
    [503, 'Something went wrong on the server. Try again; if it keeps happening, tell your administrator.'],
  ])('gives status %i a sentence of its own', (status, sentence) => {
    expect(describeHttpError(failure(status, body('x', 'raw server text')))).toBe(sentence);
  });

  it("uses the server's words for conflicts and rate limits", () => {
    expect(describeHttpError(failure(409, body('conflict', 'That e-mail is already in use.')))).toBe(
      'That e-mail is already in use.',
    );
    expect(describeHttpError(failure(429, body('rate_limited', 'Try again after 10:42.')))).toBe('Try again after 10:42.');
  });

  it('falls back to our sentence when a conflict or rate limit has no body', () => {
    expect(describeHttpError(failure(409, '<html>proxy</html>'))).toBe(
      'Someone changed this in the meantime. Reload and try again.',
    );
    expect(describeHttpError(failure(429))).toBe('Too many attempts. Wait a moment and try again.');
  });

  it('explains an expired anti-forgery token differently from a missing permission', () => {
    expect(describeHttpError(failure(403, body('csrf', 'bad token')))).toBe(
      'This page was open too long to save safely. Reload it and try again.',
    );
  });
});
