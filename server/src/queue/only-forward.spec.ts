import { describe, expect, it } from 'vitest';
import type { RunMessage } from '../runs/run-on-pool.js';
import { onlyForward } from './remote-tasks.js';

describe('progress of a job taken again', () => {
  it('never goes back: a retried job is silent until it passes what was shown', () => {
    const shown: RunMessage[] = [];
    const forward = onlyForward((m) => shown.push(m));
    const p = (phase: 'weights' | 'recursion' | 'classSum', done: number) =>
      forward({ phase, done, total: 10 });
    p('weights', 5);
    p('recursion', 3);
    p('recursion', 6);
    // the worker died; another starts the job from the beginning
    forward({ started: 2 });
    p('weights', 1);
    p('weights', 9);
    p('recursion', 2);
    p('recursion', 6);
    p('recursion', 8);
    p('classSum', 1);
    expect(shown).toEqual([
      { phase: 'weights', done: 5, total: 10 },
      { phase: 'recursion', done: 3, total: 10 },
      { phase: 'recursion', done: 6, total: 10 },
      { started: 2 },
      { phase: 'recursion', done: 6, total: 10 },
      { phase: 'recursion', done: 8, total: 10 },
      { phase: 'classSum', done: 1, total: 10 },
    ]);
  });
});
