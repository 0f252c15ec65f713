import Bowser from 'bowser';

/** Longest description kept: a few words, whatever a client sends as its User-Agent. */
const MAX_LENGTH = 80;

/**
 * The browser and operating system of a User-Agent header in a few words ("Firefox on Linux",
 * "Safari on iOS"), parsed by bowser, for a member's list of their own sessions. A missing or
 * unrecognised header gives "Unknown browser"; the raw header is never stored.
 */
export function describeDevice(userAgent: string | undefined): string {
  if (!userAgent) return 'Unknown browser';
  const parsed = Bowser.parse(userAgent.slice(0, 512));
  const browser = parsed.browser.name || 'Unknown browser';
  const system = parsed.os.name;
  return (system ? `${browser} on ${system}` : browser).slice(0, MAX_LENGTH);
}
