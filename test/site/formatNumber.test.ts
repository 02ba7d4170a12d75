import { describe, expect, it } from "vitest";
import {
  columnIsScientific,
  formatExact,
  formatNumber,
  formatPercent,
  numberPartsIn,
  partsText,
} from "../../src/presentation/formatNumber.js";

// Rounding to significant figures as defined by ECMAScript Number.prototype.toPrecision (ECMA-262).
describe("number formatting on the pages", () => {
  it("six significant figures in fixed notation between 1e-3 and 1e6", () => {
    expect(formatNumber(1234.56789)).toBe("1234.57");
    expect(formatNumber(0.00123456789)).toBe("0.00123457");
    expect(formatNumber(-0.5)).toBe("\u22120.500000");
    expect(formatNumber(0)).toBe("0");
  });
  it("scientific notation with a superscript exponent outside that range", () => {
    expect(formatNumber(2.876276e10)).toBe("2.87628 \u00d7 10\u00b9\u2070");
    expect(formatNumber(8.9924e-5)).toBe("8.99240 \u00d7 10\u207b\u2075");
  });
  it("the notation follows the rounded value: 999999.7 is 1.00000 x 10^6, not 1000000", () => {
    expect(formatNumber(999999.7)).toBe("1.00000 \u00d7 10\u2076");
    expect(formatNumber(0.00099999996)).toBe("0.00100000");
  });
  it("one column, one style: a column with any value in scientific notation prints all of them so", () => {
    const column = [0.00103223, 8.59504e-4];
    expect(columnIsScientific(column)).toBe(true);
    expect(column.map((x) => partsText(numberPartsIn(x, true)))).toEqual([
      "1.03223 \u00d7 10\u207b\u00b3",
      "8.59504 \u00d7 10\u207b\u2074",
    ]);
    expect(columnIsScientific([1.5, 2000, null])).toBe(false);
  });
  it("null and non-finite values print as an em dash", () => {
    expect(formatNumber(null)).toBe("\u2014");
    expect(formatNumber(Infinity)).toBe("\u2014");
  });
  it("percentages carry a sign and three significant figures", () => {
    expect(formatPercent(0.012345)).toBe("+1.23\u00a0%");
    expect(formatPercent(-0.0911)).toBe("\u22129.11\u00a0%");
    expect(formatPercent(0)).toBe("0\u00a0%");
  });
  it("inputs print exactly as given", () => {
    expect(formatExact(68.2)).toBe("68.2");
    expect(formatExact(-1)).toBe("\u22121");
    expect(formatExact(1e-10)).toBe("1 \u00d7 10\u207b\u00b9\u2070");
  });
});
