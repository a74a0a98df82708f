import { describe, expect, it } from 'vitest';
import { pageOf, pageParam, withParams } from './list-params.ts';

describe('list params', () => {
  it('sets, replaces and removes keys without touching the others', () => {
    const params = new URLSearchParams('page=3&event=12&q=k65');
    expect(withParams(params, { event: '14' }).toString()).toBe('page=3&event=14&q=k65');
    expect(withParams(params, { event: null, q: '' }).toString()).toBe('page=3');
    expect(withParams(params, { sort: '-title' }).toString()).toBe('page=3&event=12&q=k65&sort=-title');
    expect(params.toString()).toBe('page=3&event=12&q=k65');
  });

  it('reads the page from 1 and writes the first page as no key', () => {
    expect(pageOf(new URLSearchParams(''))).toBe(1);
    expect(pageOf(new URLSearchParams('page=0'))).toBe(1);
    expect(pageOf(new URLSearchParams('page=abc'))).toBe(1);
    expect(pageOf(new URLSearchParams('page=4'))).toBe(4);
    expect(pageOf(new URLSearchParams('page=2.5'))).toBe(2);
    expect(pageParam(0)).toBeNull();
    expect(pageParam(2)).toBe('3');
  });
});
