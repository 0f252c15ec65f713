import { Subject, of } from 'rxjs';
import { pollUntilFinished } from './poll-until-finished';

interface Status {
  readonly state: 'running' | 'done';
  readonly progress: number;
}

describe('pollUntilFinished', () => {
  beforeEach(() => vi.useFakeTimers());
  afterEach(() => vi.useRealTimers());

  it('checks again after each answer and stops at the first finished status', () => {
    const answers: Status[] = [
      { state: 'running', progress: 0.2 },
      { state: 'running', progress: 0.7 },
      { state: 'done', progress: 1 },
      { state: 'done', progress: 1 },
    ];
    let calls = 0;
    const seen: Status[] = [];
    let isComplete = false;
    pollUntilFinished(() => of(answers[calls++] ?? answers[3]), (status) => status.state === 'done', 500).subscribe({
      next: (status) => seen.push(status),
      complete: () => (isComplete = true),
    });

    expect(calls).toBe(1);
    vi.advanceTimersByTime(499);
    expect(calls).toBe(1);
    vi.advanceTimersByTime(1);
    expect(calls).toBe(2);
    vi.advanceTimersByTime(500);
    expect(calls).toBe(3);
    vi.advanceTimersByTime(5000);
    expect(calls).toBe(3);
    expect(seen.map((status) => status.progress)).toEqual([0.2, 0.7, 1]);
    expect(isComplete).toBe(true);
  });

  it('never asks again while an answer is still on its way', () => {
    const pending = new Subject<Status>();
    let calls = 0;
    pollUntilFinished(
      () => {
        calls++;
        return pending;
      },
      (status) => status.state === 'done',
      100,
    ).subscribe();
    vi.advanceTimersByTime(1000);
    expect(calls).toBe(1);
  });
});
