// A small least-recently-used cache whose entries are valid for one data version (a counter the
// database moves on every relevant write, migration 0006). It only saves work: a second server
// instance, or this one after a restart, recomputes and gets the same answer.

export type Versioned<T> = { version: string; value: T; bytes: number };

export class VersionedCache<T> {
  private readonly entries = new Map<string, Versioned<T>>();
  private readonly inFlight = new Map<string, Promise<Versioned<T>>>();
  private bytes = 0;

  constructor(private readonly maxBytes: number) {}

  /** The entry for key if it was computed at exactly this version. */
  get(key: string, version: string): T | undefined {
    const hit = this.entries.get(key);
    if (!hit || hit.version !== version) return undefined;
    this.entries.delete(key);
    this.entries.set(key, hit);
    return hit.value;
  }

  /**
   * Computes once for every caller that read the same version meanwhile; a caller that read a
   * newer version never gets an answer computed before its own read.
   */
  async compute(key: string, seenVersion: string, run: () => Promise<Versioned<T>>): Promise<T> {
    const flightKey = `${key}@${seenVersion}`;
    let flight = this.inFlight.get(flightKey);
    if (!flight) {
      flight = run().finally(() => this.inFlight.delete(flightKey));
      this.inFlight.set(flightKey, flight);
      void flight.then(
        (entry) => this.put(key, entry),
        () => undefined,
      );
    }
    return (await flight).value;
  }

  get size(): number {
    return this.entries.size;
  }

  private put(key: string, entry: Versioned<T>): void {
    const old = this.entries.get(key);
    if (old && BigInt(old.version) > BigInt(entry.version)) return;
    if (old) this.drop(key, old);
    if (entry.bytes > this.maxBytes) return;
    this.entries.set(key, entry);
    this.bytes += entry.bytes;
    for (const [k, e] of this.entries) {
      if (this.bytes <= this.maxBytes) break;
      this.drop(k, e);
    }
  }

  private drop(key: string, entry: Versioned<T>): void {
    this.entries.delete(key);
    this.bytes -= entry.bytes;
  }
}
