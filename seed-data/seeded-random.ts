/**
 * Deterministic pseudo-random numbers for the demo generator: the same seed gives the same portfolio on
 * every machine. mulberry32 (a public-domain 32-bit generator by Tommy Ettinger) is ample for invented data;
 * it is not meant for statistics that depend on the quality of the random stream.
 */
export class SeededRandom {
  private state: number;
  private spareNormal: number | undefined;

  constructor(seed: number) {
    this.state = seed >>> 0;
  }

  /** Uniform on [0, 1). */
  next(): number {
    this.state = (this.state + 0x6d2b79f5) >>> 0;
    let t = this.state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  between(low: number, high: number): number {
    return low + (high - low) * this.next();
  }

  integer(low: number, high: number): number {
    return Math.floor(this.between(low, high + 1));
  }

  pick<T>(items: readonly T[]): T {
    return items[Math.floor(this.next() * items.length)] as T;
  }

  /** Standard normal by the Box–Muller transform (Box & Muller 1958), both values used. */
  normal(): number {
    if (this.spareNormal !== undefined) {
      const spare = this.spareNormal;
      this.spareNormal = undefined;
      return spare;
    }
    const u = 1 - this.next();
    const v = this.next();
    const r = Math.sqrt(-2 * Math.log(u));
    this.spareNormal = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  }

  /** Poisson by inversion for small means, normal approximation above 500 (ample for demo counts). */
  poisson(mean: number): number {
    if (mean > 500) return Math.max(0, Math.round(mean + Math.sqrt(mean) * this.normal()));
    const limit = Math.exp(-mean);
    let k = 0;
    let product = this.next();
    while (product > limit) {
      k += 1;
      product *= this.next();
    }
    return k;
  }

  /** A version-4 UUID built from the stream, so ids are stable across runs. */
  uuid(): string {
    const bytes: number[] = [];
    for (let i = 0; i < 16; i += 1) bytes.push(Math.floor(this.next() * 256));
    bytes[6] = ((bytes[6] as number) & 0x0f) | 0x40;
    bytes[8] = ((bytes[8] as number) & 0x3f) | 0x80;
    const hex = bytes.map((b) => b.toString(16).padStart(2, '0')).join('');
    return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
  }
}
