import { DOCUMENT } from '@angular/common';
import { TestBed } from '@angular/core/testing';
import { XsrfCookieExtractor } from './xsrf-cookie-extractor';

describe('XsrfCookieExtractor', () => {
  function extractorWith(cookie: string): XsrfCookieExtractor {
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({ providers: [XsrfCookieExtractor, { provide: DOCUMENT, useValue: { cookie } }] });
    return TestBed.inject(XsrfCookieExtractor);
  }

  it('reads the plain-HTTP cookie, decoded', () => {
    expect(extractorWith('theme=dark; XSRF-TOKEN=abc%7C123').getToken()).toBe('abc|123');
  });

  it('prefers the __Host- cookie of an HTTPS-only installation', () => {
    expect(extractorWith('XSRF-TOKEN=old; __Host-XSRF-TOKEN=new%7C9').getToken()).toBe('new|9');
  });

  it('answers null without either cookie, and ignores look-alike names', () => {
    expect(extractorWith('theme=dark').getToken()).toBeNull();
    expect(extractorWith('MY-XSRF-TOKEN=x; XSRF-TOKEN-OLD=y').getToken()).toBeNull();
  });
});
