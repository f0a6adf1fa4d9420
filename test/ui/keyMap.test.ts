import { describe, it, expect } from 'vitest';
import { KEY_MAP, actionForKey } from '../../src/ui/keys/keyMap';
import { PLOT_KEYS } from '../../src/ui/plots/viewActions';
import { FLAGS, flagByKey } from '../../src/ui/review/flags';

describe('KEY_MAP', () => {
  it('binds no key twice', () => {
    const all = KEY_MAP.flatMap((b) => b.keys);
    expect(new Set(all).size).toBe(all.length);
  });

  it('shares no key with the plot, so a focused plot never also triggers a review action', () => {
    const plot = new Set(PLOT_KEYS.flatMap((p) => p.keys));
    expect(KEY_MAP.flatMap((b) => b.keys).filter((k) => plot.has(k))).toEqual([]);
  });

  it('maps keys to actions and leaves modifier chords alone', () => {
    expect(actionForKey({ key: 'a' })).toBe('accept');
    expect(actionForKey({ key: '3' })).toBe('candidate');
    expect(actionForKey({ key: 'a', ctrlKey: true })).toBeNull();
    expect(actionForKey({ key: 'q' })).toBeNull();
  });
});

it('every review flag has its own key, bound to the flag action', () => {
  expect(new Set(FLAGS.map((f) => f.key)).size).toBe(FLAGS.length);
  for (const f of FLAGS) {
    expect(actionForKey({ key: f.key })).toBe('flag');
    expect(flagByKey(f.key)?.id).toBe(f.id);
  }
});
