import { describe, expect, it } from 'vitest';
import { type PoolOutcome, runPool } from '../../../app/run/pool';
import type { StandInInput } from './fixtures/standInTask';

const TASK = new URL('./fixtures/standInTask.ts', import.meta.url);

async function runAll(inputs: StandInInput[], extra: { itemTimeoutMs?: number; batchSize?: number } = {}) {
  const outcomes: PoolOutcome<{ square: number }>[] = [];
  const pool = runPool<StandInInput, { square: number }>({
    taskModule: TASK,
    taskExport: 'standIn',
    count: inputs.length,
    input: (i) => inputs[i],
    onOutcome: (o) => outcomes.push(o),
    workers: 2,
    ...extra,
  });
  const state = await pool.done;
  outcomes.sort((a, b) => a.index - b.index);
  return { state, outcomes, workersStarted: pool.workersStarted };
}

describe('worker pool (stand-in task, tests only)', () => {
  it('answers every item once, on two workers loading TypeScript', async () => {
    const inputs = Array.from({ length: 200 }, (_, x) => ({ x }));
    const { state, outcomes, workersStarted } = await runAll(inputs);
    expect(state).toBe('done');
    expect(workersStarted).toBe(2);
    expect(outcomes.map((o) => o.index)).toEqual(inputs.map((_, i) => i));
    // x² by definition of the stand-in
    expect(outcomes.every((o) => o.ok && o.value.square === inputs[o.index].x ** 2)).toBe(true);
  });

  it('isolates an item that throws, a worker that exits, an uncloneable result and an async item', async () => {
    const inputs: StandInInput[] = Array.from({ length: 60 }, (_, x) => ({ x }));
    inputs[7].mode = 'throw';
    inputs[13].mode = 'exit';
    inputs[41].mode = 'exit';
    inputs[20].mode = 'uncloneable';
    inputs[30].mode = 'async';
    const { state, outcomes, workersStarted } = await runAll(inputs, { batchSize: 5 });
    expect(state).toBe('done');
    expect(outcomes).toHaveLength(60);
    const bad = outcomes.filter((o) => !o.ok).map((o) => [o.index, o.ok ? '' : o.kind]);
    expect(bad).toEqual([
      [7, 'threw'],
      [13, 'worker-died'],
      [20, 'threw'],
      [41, 'worker-died'],
    ]);
    const o7 = outcomes[7];
    expect(!o7.ok && o7.error).toContain('stand-in refuses item 7');
    expect(workersStarted).toBe(4); // two replaced
    const o30 = outcomes[30];
    expect(o30.ok && o30.value.square).toBe(900);
  });

  it('terminates a worker that hangs on an item and goes on', async () => {
    const inputs: StandInInput[] = Array.from({ length: 20 }, (_, x) => ({ x }));
    inputs[3].mode = 'hang';
    const { state, outcomes } = await runAll(inputs, { itemTimeoutMs: 400, batchSize: 2 });
    expect(state).toBe('done');
    const bad = outcomes.filter((o) => !o.ok);
    expect(bad.map((o) => [o.index, !o.ok && o.kind])).toEqual([[3, 'timeout']]);
    expect(outcomes.filter((o) => o.ok)).toHaveLength(19);
  });

  it('cancels cleanly part way', async () => {
    const inputs: StandInInput[] = Array.from({ length: 400 }, (_, x) => ({ x, spinMs: 5 }));
    let seen = 0;
    const pool = runPool<StandInInput, unknown>({
      taskModule: TASK,
      taskExport: 'standIn',
      count: inputs.length,
      input: (i) => inputs[i],
      onOutcome: () => {
        seen++;
        if (seen === 30) pool.cancel();
      },
      workers: 2,
      batchSize: 4,
    });
    expect(await pool.done).toBe('cancelled');
    const at = seen;
    await new Promise((r) => setTimeout(r, 100));
    expect(seen).toBe(at); // nothing arrives after cancel
    expect(seen).toBeLessThan(400);
  });

  it('fails the pool when the task module cannot be loaded', async () => {
    const pool = runPool({
      taskModule: TASK,
      taskExport: 'noSuchExport',
      count: 3,
      input: (i) => ({ x: i }),
      onOutcome: () => {},
      workers: 1,
    });
    await expect(pool.done).rejects.toThrow(/failed to start.*noSuchExport/s);
  });
});
