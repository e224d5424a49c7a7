/**
 * One request channel to the worker: every request gets a fresh id, at most
 * one is in flight, and while it runs only the newest follow-up is kept
 * (older ones are never sent). An answer is applied only when its id is the
 * latest sent on this channel and the worker did not mark it stale.
 *
 * With `supersede` (for channels whose worker work pauses between pieces and
 * answers { stale: true } once a newer request has arrived), a newer request is
 * sent at once instead: the worker learns of it at its next pause and drops the
 * older work there, instead of finishing it first.
 */
export interface Answer {
  requestId: number;
  stale?: boolean;
  error?: string;
}

export class Channel<A extends Answer> {
  private nextId = 1;
  private latestSent = 0;
  private inFlight = 0;
  private queued: ((id: number) => Promise<A>) | null = null;
  dropped = 0;

  constructor(
    private readonly apply: (a: A) => void,
    private readonly fail: (msg: string) => void,
    private readonly busy: (b: boolean) => void = () => {},
    private readonly supersede = false,
  ) {}

  /** Ask; `call(id)` performs the worker call with that request id. */
  request(call: (id: number) => Promise<A>): void {
    if (this.inFlight > 0 && !this.supersede) {
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
    if (this.inFlight++ === 0) this.busy(true);
    call(id)
      .then((a) => this.accept(a), (e: unknown) => this.fail(e instanceof Error ? e.message : String(e)))
      .finally(() => {
        this.inFlight--;
        const q = this.queued;
        this.queued = null;
        if (q) this.send(q);
        else if (this.inFlight === 0) this.busy(false);
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
