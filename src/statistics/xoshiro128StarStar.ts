/**
 * The pseudo-random generator behind every draw: xoshiro128** 1.1 (Blackman & Vigna, "Scrambled linear pseudorandom
 * number generators", ACM TOMS 47, 36, 2021), its 128-bit state filled from a 32-bit seed by four terms of a Weyl
 * sequence passed through MurmurHash3's 32-bit finalizer (weylFmix32 below). Pure 32-bit integer arithmetic, so a
 * seed gives the same stream on every machine. Known-answer vectors: test/fixtures/xoshiro/ (an independent script).
 */
export const GENERATOR_NAME = "xoshiro128** 1.1, seeded by a golden-ratio Weyl sequence through MurmurHash3's fmix32";

/**
 * One seeding step: a Weyl sequence with the golden-ratio increment 0x9E3779B9, each term mixed by MurmurHash3's
 * 32-bit finalizer fmix32 (Appleby; shifts 16, 13, 16 and multipliers 0x85EBCA6B, 0xC2B2AE35), the 32-bit analogue
 * of SplitMix64's construction (Steele, Lea & Flood 2014), which Blackman & Vigna recommend for seeding.
 */
function weylFmix32(state: { s: number }): number {
  state.s = (state.s + 0x9e3779b9) | 0;
  let z = state.s;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  return (z ^ (z >>> 16)) >>> 0;
}

/** 32-bit FNV-1a of a string's UTF-16 code units (Fowler, Noll & Vo): mixes a model id into its stream's seed. */
export function fnv1a32(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) h = Math.imul(h ^ text.charCodeAt(i), 0x01000193);
  return h >>> 0;
}

export class Xoshiro128StarStar {
  private a: number;
  private b: number;
  private c: number;
  private d: number;

  constructor(seed: number) {
    const st = { s: seed | 0 };
    this.a = weylFmix32(st);
    this.b = weylFmix32(st);
    this.c = weylFmix32(st);
    this.d = weylFmix32(st);
  }

  /** The next 32-bit output, as an unsigned integer. */
  nextUint32(): number {
    const result = Math.imul(rotl(Math.imul(this.b, 5), 7), 9) >>> 0;
    const t = this.b << 9;
    this.c ^= this.a;
    this.d ^= this.b;
    this.b ^= this.c;
    this.a ^= this.d;
    this.c ^= t;
    this.d = rotl(this.d, 11);
    return result;
  }

  /** A uniform deviate strictly inside (0, 1): 53 random bits, offset by half a step so 0 and 1 never occur. */
  nextOpenUnit(): number {
    const hi = this.nextUint32() >>> 5; // 27 bits
    const lo = this.nextUint32() >>> 6; // 26 bits
    return (hi * 67108864 + lo + 0.5) / 9007199254740992;
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
