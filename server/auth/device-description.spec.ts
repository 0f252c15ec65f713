import { describeDevice } from './device-description';

// User-Agent strings as the browsers send them (documented formats: MDN "User-Agent" reference,
// which quotes these shapes for Firefox, Chrome, Safari on iOS and Edge); names as bowser reports them.
describe('describeDevice', () => {
  it.each([
    ['Mozilla/5.0 (X11; Linux x86_64; rv:133.0) Gecko/20100101 Firefox/133.0', 'Firefox on Linux'],
    ['Mozilla/5.0 (Windows NT 10.0; Win64; x64) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/131.0.0.0 Safari/537.36', 'Chrome on Windows'],
    ['Mozilla/5.0 (iPad; CPU OS 17_5 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.5 Mobile/15E148 Safari/604.1', 'Safari on iOS'],
    ['Mozilla/5.0 (Windows NT 10.0; Win64; x64) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/131.0.0.0 Safari/537.36 Edg/131.0.0.0', 'Microsoft Edge on Windows'],
  ])('names %s as %s', (userAgent, expected) => {
    expect(describeDevice(userAgent)).toBe(expected);
  });

  it('says "Unknown browser" without a header, and keeps anything odd short', () => {
    expect(describeDevice(undefined)).toBe('Unknown browser');
    expect(describeDevice('')).toBe('Unknown browser');
    expect(describeDevice('x'.repeat(10_000)).length).toBeLessThanOrEqual(80);
  });
});
