import { HttpTestingController, TestRequest } from '@angular/common/http/testing';

/** A short real pause, so a poll timer (1 ms in specs) can fire. */
export function pause(ms = 5): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

/** Waits (up to about half a second) for the next request to `url`, as a job poll sends it. */
export async function nextRequest(http: HttpTestingController, url: string): Promise<TestRequest> {
  for (let tries = 0; tries < 100; tries++) {
    const [request] = http.match(url);
    if (request) return request;
    await pause();
  }
  throw new Error(`No request to ${url} arrived.`);
}
