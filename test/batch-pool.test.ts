/**
 * The worker pool on its own, with a worker whose behaviour each input picks:
 * a task that never returns, one that throws, one that ends its thread.
 * The worker is a compiled-JS fixture (piscina loads JavaScript); it imports
 * the built dist/ (`npm test` builds first).
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runOnPool, type TaskOutcome } from '../engine/audit/worker-pool.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const workerFile = path.join(repoRoot, 'test/fixtures/batch/pool-worker.mjs');

interface Echo {
  // what the fixture worker returns
  echo: string;
  threadId: number;
  prefix: string;
}

async function runAll(inputs: string[], threads: number, timeoutMs: number): Promise<{ outcomes: TaskOutcome<Echo>[]; calls: number[] }> {
  const outcomes = new Array<TaskOutcome<Echo>>(inputs.length);
  const calls = new Array<number>(inputs.length).fill(0);
  await runOnPool<string, Echo, { prefix: string }>(inputs, { filename: workerFile, threads, timeoutMs, shared: { prefix: 'p' } }, (i, o) => {
    outcomes[i] = o;
    calls[i]!++;
  });
  return { outcomes, calls };
}

describe('worker pool', () => {
  it('needs the built dist/ (npm test runs the build first)', () => {
    expect(existsSync(path.join(repoRoot, 'dist/engine/audit/worker-pool.js'))).toBe(true);
  });

  it('stops a task that never returns after its budget, replaces the worker and finishes every other task', async () => {
    // Three endless tasks on two threads: the later tasks can only finish if killed workers are replaced.
    const inputs = ['a', 'spin', 'b', 'spin', 'c', 'd', 'spin', 'e', 'f'];
    const { outcomes, calls } = await runAll(inputs, 2, 400);
    expect(calls).toEqual(inputs.map(() => 1));
    inputs.forEach((input, i) => {
      const o = outcomes[i]!;
      if (input === 'spin') expect(o).toEqual({ kind: 'stopped', afterMs: 400 });
      else {
        expect(o.kind).toBe('done');
        if (o.kind === 'done') expect(o.value).toMatchObject({ echo: input, prefix: 'p' });
      }
    });
  });

  it('with one thread, every task after an endless one runs on a fresh worker', async () => {
    const inputs = ['a', 'spin', 'b', 'spin', 'c'];
    const { outcomes } = await runAll(inputs, 1, 300);
    expect(outcomes.map((o) => o.kind)).toEqual(['done', 'stopped', 'done', 'stopped', 'done']);
    const ids = outcomes.flatMap((o) => (o.kind === 'done' ? [o.value.threadId] : []));
    expect(new Set(ids).size).toBe(3);
  });

  it("a worker's start-up time is not charged to its first task", async () => {
    // Each worker takes 1 s to load; the tasks themselves are instant; the budget is 300 ms.
    const outcomes: TaskOutcome<Echo>[] = [];
    await runOnPool<string, Echo, { prefix: string; startDelayMs: number }>(
      ['a', 'b', 'c'],
      { filename: workerFile, threads: 2, timeoutMs: 300, shared: { prefix: 'slow', startDelayMs: 1000 } },
      (i, o) => (outcomes[i] = o),
    );
    expect(outcomes.map((o) => (o.kind === 'done' ? o.value.echo : o.kind))).toEqual(['a', 'b', 'c']);
  });

  it('a task that throws or ends its thread fails alone', async () => {
    const inputs = ['a', 'throw', 'b', 'exit', 'c', 'exit', 'd'];
    const { outcomes } = await runAll(inputs, 2, 10_000);
    expect(outcomes[1]).toEqual({ kind: 'failed', message: 'thrown on purpose' });
    expect(outcomes[3]!.kind).toBe('failed');
    expect(outcomes[5]!.kind).toBe('failed');
    for (const i of [0, 2, 4, 6]) {
      const o = outcomes[i]!;
      expect(o.kind).toBe('done');
      if (o.kind === 'done') expect(o.value.echo).toBe(inputs[i]);
    }
  });

  it('handles a batch much larger than the pool, each input once', async () => {
    const inputs = Array.from({ length: 2000 }, (_, i) => `n${i}`);
    const { outcomes, calls } = await runAll(inputs, 2, 10_000);
    expect(calls.every((c) => c === 1)).toBe(true);
    expect(outcomes.map((o) => (o.kind === 'done' ? o.value.echo : o.kind))).toEqual(inputs);
  });

  it('refuses a missing worker file with a clear error', async () => {
    await expect(runOnPool(['a'], { filename: path.join(repoRoot, 'test/fixtures/batch/missing.mjs'), threads: 1, timeoutMs: 1000, shared: null }, () => undefined)).rejects.toThrow(
      /worker file not found/,
    );
  });
});
