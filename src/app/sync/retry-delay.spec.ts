import { retryDelayMs } from './retry-delay';

describe('retryDelayMs', () => {
  it('should double the wait after each failure, from 5 seconds', () => {
    expect([1, 2, 3, 4].map((failures) => retryDelayMs(failures, () => 1))).toEqual([5_000, 10_000, 20_000, 40_000]);
  });

  it('should never wait longer than 5 minutes', () => {
    expect(retryDelayMs(30, () => 1)).toBe(300_000);
  });

  it('should spread retries over the upper half of the wait', () => {
    expect(retryDelayMs(3, () => 0)).toBe(10_000);
    expect(retryDelayMs(3, () => 0.5)).toBe(15_000);
  });
});
