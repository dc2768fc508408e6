import { afterEach, describe, expect, it, vi } from 'vitest';
import { missingOutside } from '../../support/outside';

describe('missingOutside', () => {
  const saved = process.env.CI;
  afterEach(() => {
    if (saved === undefined) delete process.env.CI;
    else process.env.CI = saved;
    vi.restoreAllMocks();
  });

  it('fails the run under CI=true', () => {
    process.env.CI = 'true';
    expect(() => missingOutside('python3-segyio is missing')).toThrow('python3-segyio is missing');
  });

  it('warns loudly and lets the run go on elsewhere', () => {
    delete process.env.CI;
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => {});
    expect(() => missingOutside('chromium is missing')).not.toThrow();
    expect(warn).toHaveBeenCalledWith(expect.stringContaining('*** chromium is missing'));
  });
});
