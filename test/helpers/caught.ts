import { expect } from 'vitest';
import { SpectrumReadError } from '../../src/core/types';

/** Run f, which must throw a SpectrumReadError, and return that error for further checks. */
export function caught(f: () => unknown): SpectrumReadError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(SpectrumReadError);
    return e as SpectrumReadError;
  }
  throw new Error('expected a SpectrumReadError');
}
