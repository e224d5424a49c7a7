/**
 * One request channel to the worker: every request gets a fresh id, at most
 * one is in flight, and while it runs only the newest follow-up is kept
 * (older ones are never sent). An answer is applied only when its id is the
 * latest sent on this channel and the worker did not mark it stale.
 */
export interface Answer {
  requestId: number;
  stale?: boolean;
  error?: string;
}

export class Channel<A extends Answer> {
  private nextId = 1;
  private latestSent = 0;
  private inFlight = false;
  private queued: ((id: number) => Promise<A>) | null = null;
  dropped = 0;

  constructor(
    private readonly apply: (a: A) => void,
    private readonly fail: (msg: string) => void,
    private readonly busy: (b: boolean) => void = () => {},
  ) {}

  /** Ask; `call(id)` performs the worker call with that request id. */
  request(call: (id: number) => Promise<A>): void {
    if (this.inFlight) {
      this.queued = call;
      return;
    }
    this.send(call);
  }

  get latestId(): number {
    return this.latestSent;
  }

  private send(call: (id: number) => Promise<A>): void {
    const id = this.nextId++;
    this.latestSent = id;
    this.inFlight = true;
    this.busy(true);
    call(id)
      .then((a) => this.accept(a), (e: unknown) => this.fail(e instanceof Error ? e.message : String(e)))
      .finally(() => {
        this.inFlight = false;
        const q = this.queued;
        this.queued = null;
        if (q) this.send(q);
        else this.busy(false);
      });
  }

  /** Public for tests: decide whether an answer is current. */
  accept(a: A): boolean {
    if (a.stale || a.requestId !== this.latestSent) {
      this.dropped++;
      return false;
    }
    if (a.error) {
      this.fail(a.error);
      return false;
    }
    this.apply(a);
    return true;
  }
}
