// Seeded random numbers for tolerance studies: the Mersenne Twister MT19937 (Matsumoto & Nishimura, ACM Trans.
// Modeling and Computer Simulation 8(1), 1998), its 53-bit uniform doubles in [0, 1) (the authors' genrand_res53),
// and standard normal deviates by the Box–Muller transform (Box & Muller, Ann. Math. Stat. 29, 1958), both values of
// each pair used in turn. The same seed gives the same sequence on every machine and engine.

const N = 624, M = 397;
const MATRIX_A = 0x9908b0df, UPPER = 0x80000000, LOWER = 0x7fffffff;

export class Mt19937 {
  private readonly mt = new Uint32Array(N);
  private index = N;
  private spare: number | null = null;

  /** Seeded as the reference init_genrand does (any integer; taken modulo 2³²). */
  constructor(seed: number) {
    const mt = this.mt;
    mt[0] = seed >>> 0;
    for (let i = 1; i < N; i++) {
      const prev = mt[i - 1] ^ (mt[i - 1] >>> 30);
      mt[i] = (Math.imul(1812433253, prev) + i) >>> 0;
    }
  }

  private twist(): void {
    const mt = this.mt;
    for (let k = 0; k < N; k++) {
      const y = (mt[k] & UPPER) | (mt[(k + 1) % N] & LOWER);
      mt[k] = mt[(k + M) % N] ^ (y >>> 1) ^ (y & 1 ? MATRIX_A : 0);
    }
    this.index = 0;
  }

  /** The next 32-bit output, 0 … 2³² − 1. */
  nextUint32(): number {
    if (this.index >= N) this.twist();
    let y = this.mt[this.index++];
    y ^= y >>> 11;
    y ^= (y << 7) & 0x9d2c5680;
    y ^= (y << 15) & 0xefc60000;
    y ^= y >>> 18;
    return y >>> 0;
  }

  /** A uniform double in [0, 1) with 53 random bits. */
  uniform(): number {
    const a = this.nextUint32() >>> 5, b = this.nextUint32() >>> 6;
    return (a * 67108864 + b) / 9007199254740992;
  }

  /** A standard normal deviate (mean 0, standard deviation 1). */
  normal(): number {
    if (this.spare !== null) { const z = this.spare; this.spare = null; return z; }
    let u1 = this.uniform();
    while (u1 === 0) u1 = this.uniform(); // log(0)
    const r = Math.sqrt(-2 * Math.log(u1)), phi = 2 * Math.PI * this.uniform();
    this.spare = r * Math.sin(phi);
    return r * Math.cos(phi);
  }
}
