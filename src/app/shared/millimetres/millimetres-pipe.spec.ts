import { MillimetresPipe } from './millimetres-pipe';

describe('MillimetresPipe', () => {
  const pipe = new MillimetresPipe();

  it('shows one decimal and the unit', () => {
    expect(pipe.transform(1.5)).toBe('1.5 mm');
    expect(pipe.transform(10)).toBe('10.0 mm');
    // 2.6 − 2.1 is 0.5000000000000002 in floating point.
    expect(pipe.transform(2.6 - 2.1)).toBe('0.5 mm');
  });

  it('leads a difference with a sign and uses a true minus', () => {
    expect(pipe.transform(0.5, 'signed')).toBe('+0.5 mm');
    expect(pipe.transform(-0.5, 'signed')).toBe('−0.5 mm');
    expect(pipe.transform(-0.5)).toBe('−0.5 mm');
    expect(pipe.transform(-0.01, 'signed')).toBe('0.0 mm');
  });

  it('shows a dash for a missing reading', () => {
    expect(pipe.transform(null)).toBe('—');
    expect(pipe.transform(undefined)).toBe('—');
  });
});
