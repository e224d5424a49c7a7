import { describe, expect, it } from 'vitest';
import { Channel, type Answer } from '../../src/app/channel';

function deferred<T>() {
  let resolve!: (v: T) => void;
  const promise = new Promise<T>((r) => (resolve = r));
  return { promise, resolve };
}

describe('request channel', () => {
  it('keeps one request in flight, sends only the newest follow-up, and applies only current answers', async () => {
    const applied: number[] = [];
    const ch = new Channel<Answer & { v: number }>((a) => applied.push(a.v), () => {});
    const calls: { id: number; d: ReturnType<typeof deferred<Answer & { v: number }>> }[] = [];
    const call = (v: number) => (id: number) => {
      const d = deferred<Answer & { v: number }>();
      calls.push({ id, d });
      void v;
      return d.promise;
    };
    ch.request(call(1));
    ch.request(call(2)); // superseded before it is sent
    ch.request(call(3));
    expect(calls.length).toBe(1);
    calls[0].d.resolve({ requestId: calls[0].id, v: 1 });
    await new Promise((r) => setTimeout(r, 0));
    expect(calls.length).toBe(2); // the newest queued request (3) went out
    calls[1].d.resolve({ requestId: calls[1].id, v: 3 });
    await new Promise((r) => setTimeout(r, 0));
    expect(applied).toEqual([1, 3]);
  });

  it('drops answers the worker marked stale or that carry an old id, and reports errors', () => {
    const applied: number[] = [];
    const errors: string[] = [];
    const ch = new Channel<Answer & { v: number }>((a) => applied.push(a.v), (m) => errors.push(m));
    ch.request((id) => new Promise(() => void id));
    const id = ch.latestId;
    expect(ch.accept({ requestId: id, stale: true, v: 1 })).toBe(false);
    expect(ch.accept({ requestId: id - 1, v: 2 })).toBe(false);
    expect(ch.accept({ requestId: id, error: 'pdynNpa: out of range', v: 3 })).toBe(false);
    expect(ch.accept({ requestId: id, v: 4 })).toBe(true);
    expect(applied).toEqual([4]);
    expect(errors).toEqual(['pdynNpa: out of range']);
    expect(ch.dropped).toBe(2);
  });
});

describe('request channel that supersedes', () => {
  it('sends a newer request at once, applies only the newest answer, and is busy until all are back', async () => {
    const applied: number[] = [];
    const busy: boolean[] = [];
    const ch = new Channel<Answer & { v: number }>((a) => applied.push(a.v), () => {}, (b) => busy.push(b), true);
    const calls: { id: number; d: ReturnType<typeof deferred<Answer & { v: number }>> }[] = [];
    const call = (id: number) => {
      const d = deferred<Answer & { v: number }>();
      calls.push({ id, d });
      return d.promise;
    };
    ch.request(call);
    ch.request(call);
    expect(calls.length).toBe(2); // both went out: the worker stops the first at its next pause
    calls[0].d.resolve({ requestId: calls[0].id, stale: true, v: 1 });
    await new Promise((r) => setTimeout(r, 0));
    expect(busy).toEqual([true]);
    calls[1].d.resolve({ requestId: calls[1].id, v: 2 });
    await new Promise((r) => setTimeout(r, 0));
    expect(applied).toEqual([2]);
    expect(busy).toEqual([true, false]);
    expect(ch.dropped).toBe(1);
  });
});
