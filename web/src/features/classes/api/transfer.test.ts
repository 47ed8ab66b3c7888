import { describe, expect, it } from 'vitest';
import { processingFraction } from './transfer';

describe('the import bar while the server works', () => {
  it('an apply: checking fills the first half, the writing steps the second', () => {
    expect(processingFraction({ phase: 'reading', done: 0, total: 0, step: '' }, false)).toBe(0);
    expect(processingFraction({ phase: 'checking', done: 2500, total: 5000, step: '' }, false)).toBe(0.25);
    expect(processingFraction({ phase: 'checking', done: 5000, total: 5000, step: '' }, false)).toBe(0.5);
    expect(processingFraction({ phase: 'writing', done: 0, total: 7, step: '' }, false)).toBe(0.5);
    expect(processingFraction({ phase: 'writing', done: 7, total: 7, step: '' }, false)).toBe(1);
    expect(processingFraction({ phase: 'done', done: 7, total: 7, step: '' }, false)).toBe(1);
  });
  it('a dry run only checks: the rows fill the whole bar', () => {
    expect(processingFraction({ phase: 'checking', done: 1000, total: 4000, step: '' }, true)).toBe(0.25);
    expect(processingFraction({ phase: 'checking', done: 4000, total: 4000, step: '' }, true)).toBe(1);
  });
});
