// How an interval is printed: the median with +upper -lower, two significant figures of the smaller half-width and
// the median to the same decimal place (the Review of Particle Physics rounding in its simplest form; common
// practice). Expected strings are worked out by hand from the percentiles given.
import { describe, expect, it } from "vitest";
import { intervalOf } from "../../src/presentation/formatInterval.js";

const band = (p16: number, p50: number, p84: number) => ({
  q: [p16 - 1, p16, p50, p84, p84 + 1],
  mc_error: [0, 0, 0, 0, 0],
});

describe("intervals as the page prints them", () => {
  it("two significant figures of the smaller half-width set the decimals", () => {
    expect(intervalOf(band(13.774, 13.797, 13.82))?.text).toBe("13.797 +0.023 \u22120.023");
    expect(intervalOf(band(2900, 2920, 2941))?.text).toBe("2920 +21 \u221220");
    expect(intervalOf(band(0.2, 0.3, 0.9))?.text).toBe("0.30 +0.60 \u22120.10");
    // 0.3 - 0.2 is 0.09999999999999998 in doubles: still two figures of 0.10.
    expect(intervalOf(band(0.2, 0.3, 0.4))?.text).toBe("0.30 +0.10 \u22120.10");
  });
  it("negative medians, a median of zero, and large numbers with a shared power of ten", () => {
    expect(intervalOf(band(-0.0162, -0.0123, -0.0083))?.text).toBe("-0.0123 +0.0040 \u22120.0039");
    expect(intervalOf(band(-0.002, 0, 0.002))?.text).toBe("0.0000 +0.0020 \u22120.0020");
    expect(intervalOf(band(3.82e10, 3.864e10, 3.9e10))?.text).toBe("(3.864 +0.036 \u22120.044) \u00d7 10^10");
    expect(intervalOf(band(3.82e10, 3.864e10, 3.9e10))?.tex).toBe("3.864^{+0.036}_{-0.044}\\times 10^{10}");
  });
  it("no interval for a quantity the draws do not move, or without a band", () => {
    // Percentiles that print alike say that the quantity has no spread, never an interval of rounding noise.
    expect(intervalOf(band(5000, 5000, 5000))!.fixed).toBe(true);
    expect(intervalOf(band(5000, 5000, 5000))!.text).toBe("no spread at the digits shown");
    expect(intervalOf(band(11 - 7e-15, 11 + 2e-15, 11 + 9e-15))!.text).toBe("no spread at the digits shown");
    expect(intervalOf(null)).toBeNull();
    expect(intervalOf(undefined)).toBeNull();
  });
});
