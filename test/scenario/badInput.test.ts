import { describe, expect, it } from "vitest";
import { loadScenario } from "../../src/scenario/loadScenario.js";
import { ScenarioInputError, type ScenarioIssue } from "../../src/scenario/scenarioIssue.js";

const GOOD_MODEL = "  - id: ref\n    H0: 70\n    Omega_m: 0.3\n";

function issuesOf(text: string, file = "bad.yaml"): ScenarioIssue[] {
  try {
    loadScenario(text, file);
  } catch (e) {
    if (e instanceof ScenarioInputError) return e.issues;
    throw e; // anything else would be a crash, not a clear error
  }
  throw new Error("expected the scenario to be rejected");
}

/** Exactly the issue we expect: at this line and column, this key path, a message matching. */
function expectIssue(text: string, line: number, column: number, path: string, message: RegExp) {
  const issues = issuesOf(text);
  const hit = issues.find((i) => i.path === path && message.test(i.message));
  expect(hit, `issues were: ${JSON.stringify(issues)}`).toBeDefined();
  expect(hit!.file).toBe("bad.yaml");
  expect([hit!.line, hit!.column]).toEqual([line, column]);
}

describe("bad input gives located, actionable errors", () => {
  it("YAML syntax error", () => expectIssue("title: [unclosed\nmodels: []\n", 2, 1, "", /YAML syntax error/));
  it("tab indentation", () => expectIssue("title: t\nmodels:\n\t- id: a\n", 3, 1, "", /tab used for indentation/));
  it("duplicate keys", () => expectIssue(`title: t\ntitle: u\nmodels:\n${GOOD_MODEL}`, 2, 1, "", /duplicate key/));
  it("unknown key with the nearest valid key suggested", () =>
    expectIssue(
      "title: t\nmodels:\n  - id: ref\n    H0: 70\n    Omega_M: 0.3\n",
      5,
      5,
      "models[0].Omega_M",
      /unknown key Omega_M\. did you mean Omega_m\?/,
    ));
  it("the trade's subscripted spelling sigma_8 points to our key sigma8 (common practice: sigma_8 in papers)", () =>
    expectIssue(
      "title: t\nmodels:\n  - id: ref\n    H0: 70\n    Omega_m: 0.3\n    sigma_8: 0.8\n",
      6,
      5,
      "models[0].sigma_8",
      /unknown key sigma_8\. did you mean sigma8\?/,
    ));
  it("unknown top-level key suggests the near one", () =>
    expectIssue(`titel: t\nmodels:\n${GOOD_MODEL}`, 1, 1, "titel", /did you mean title\?/));
  it("wrong type: H0: seventy", () =>
    expectIssue(
      "title: t\nmodels:\n  - id: ref\n    H0: seventy\n    Omega_m: 0.3\n",
      4,
      9,
      "models[0].H0",
      /must be a number \(got "seventy"\)/,
    ));
  it("wrong type: flat: maybe", () =>
    expectIssue(`title: t\nmodels:\n${GOOD_MODEL}    flat: maybe\n`, 6, 11, "models[0].flat", /must be true/));
  for (const [key, value, re] of [
    ["H0", "0", /must be >= 0.01 \(got 0\)/],
    ["H0", "-70", /must be >= 0.01 \(got -70\)/],
    ["Omega_m", "-0.1", /must be >= 0/],
    ["T_cmb", "-1", /must be >= 0.01 \(got -1\)/],
    ["N_eff", "-3", /must be >= 0/],
  ] as const) {
    it(`out of range: ${key}: ${value}`, () => {
      const text = `title: t\nmodels:\n  - id: ref\n    H0: 70\n    Omega_m: 0.3\n    ${key}: ${value}\n`.replace(
        / {4}(H0|Omega_m): [^\n]*\n(?=[\s\S]* {4}\1:)/,
        "",
      );
      const issues = issuesOf(text);
      expect(
        issues.some((i) => i.path === `models[0].${key}` && re.test(i.message)),
        JSON.stringify(issues),
      ).toBe(true);
    });
  }
  it("negative redshift", () =>
    expectIssue(`title: t\nredshifts: [0.5, -1]\nmodels:\n${GOOD_MODEL}`, 2, 18, "redshifts[1]", /must be >= 0/));
  for (const bad of [".nan", ".inf", "-.inf", "1e400"]) {
    it(`non-finite number ${bad}`, () =>
      expectIssue(
        `title: t\nredshifts: [1, ${bad}]\nmodels:\n${GOOD_MODEL}`,
        2,
        16,
        "redshifts[1]",
        /is not a finite number/,
      ));
  }
  it("a model without a big bang names the turnaround redshift", () =>
    expectIssue(
      "title: t\nmodels:\n  - id: bouncer\n    H0: 70\n    Omega_m: 0.1\n    Omega_Lambda: 1.5\n",
      3,
      5,
      "models[0]",
      /no big bang.*turned around at z = \d/,
    ));
  it("unknown extends", () =>
    expectIssue(
      `title: t\nmodels:\n${GOOD_MODEL}  - id: b\n    extends: nope\n`,
      7,
      14,
      "models[1].extends",
      /extends unknown model nope; known ids: ref, b/,
    ));
  it("cyclic extends", () => {
    const issues = issuesOf("title: t\nmodels:\n  - id: a\n    extends: b\n  - id: b\n    extends: a\n");
    expect(issues.some((i) => /cyclic extends: (a -> b -> a|b -> a -> b)/.test(i.message))).toBe(true);
  });
  it("duplicate model ids", () =>
    expectIssue(`title: t\nmodels:\n${GOOD_MODEL}${GOOD_MODEL}`, 6, 9, "models[1].id", /duplicate model id ref/));
  it("unknown baseline", () =>
    expectIssue(
      `title: t\nbaseline: other\nmodels:\n${GOOD_MODEL}`,
      2,
      11,
      "baseline",
      /unknown model other; known ids: ref/,
    ));
  it("over-determined curvature", () =>
    expectIssue(
      `title: t\nmodels:\n${GOOD_MODEL}    flat: true\n    Omega_k: 0.1\n`,
      7,
      5,
      "models[0].Omega_k",
      /over-determined/,
    ));
  it("contradictory curvature: Omega_Lambda with evolving w", () =>
    expectIssue(
      `title: t\nmodels:\n${GOOD_MODEL}    Omega_Lambda: 0.7\n    w0: -0.9\n`,
      6,
      5,
      "models[0].Omega_Lambda",
      /cosmological constant/,
    ));
  it("contradictory radiation", () =>
    expectIssue(
      `title: t\nmodels:\n${GOOD_MODEL}    radiation: none\n    T_cmb: 2.7\n`,
      7,
      5,
      "models[0].T_cmb",
      /contradictory radiation/,
    ));
  it("empty models", () => expectIssue("title: t\nmodels: []\n", 2, 9, "models", /at least 1/));
  it("missing models", () => expectIssue("title: t\n", 1, 1, "", /missing required key models/));
  it("missing H0 after inheritance", () =>
    expectIssue("title: t\nmodels:\n  - id: a\n    Omega_m: 0.3\n", 3, 5, "models[0]", /H0 is required/));
  it("top level that is not a mapping", () => expectIssue("- a\n- b\n", 1, 1, "", /must be a mapping/));
  it("empty file", () => expectIssue("", 1, 1, "", /the file is empty/));
  it("comment-only file", () => expectIssue("# nothing\n", 1, 1, "", /the file is empty/));
  it("an id that is not a safe slug", () =>
    expectIssue(`title: t\nid: ../../etc\nmodels:\n${GOOD_MODEL}`, 2, 5, "id", /must be a slug/));
  it("a file name with unsafe characters needs an explicit id", () => {
    expect(() => loadScenario(`title: t\nmodels:\n${GOOD_MODEL}`, "My Plan.yaml")).toThrow(
      /add a line such as "id: my-scenario"/,
    );
  });
  it("more than 500 models", () => {
    const models = Array.from({ length: 501 }, (_, i) => `  - { id: m${i}, H0: 70, Omega_m: 0.3 }\n`).join("");
    expectIssue(`title: t\nmodels:\n${models}`, 3, 3, "models", /at most 500 items/);
  });
  it("more than 10,000 table redshifts or 20,000 grid points", () => {
    expectIssue(
      `title: t\nredshifts: [${Array.from({ length: 10001 }, () => "1").join(",")}]\nmodels:\n${GOOD_MODEL}`,
      2,
      12,
      "redshifts",
      /at most 10000 items/,
    );
    expectIssue(`title: t\ngrid: { points: 20001 }\nmodels:\n${GOOD_MODEL}`, 2, 17, "grid.points", /must be <= 20000/);
  });
  it("more than 20,000 table or 100,000 grid evaluations (the documented limits), each list within its own", () => {
    const models = (n: number) =>
      Array.from({ length: n }, (_, i) => `  - { id: m${i}, H0: 70, Omega_m: 0.3 }\n`).join("");
    const zs = Array.from({ length: 1001 }, (_, i) => (i / 100).toString()).join(",");
    expectIssue(
      `title: t\nredshifts: [${zs}]\ngrid: { points: 10 }\nmodels:\n${models(20)}`,
      5,
      3,
      "models",
      /20020 table evaluations .* at most 20000/,
    );
    expectIssue(
      `title: t\nredshifts: [1]\ngrid: { points: 5001 }\nmodels:\n${models(20)}`,
      3,
      17,
      "grid.points",
      /100020 chart-grid evaluations .* at most 100000/,
    );
    // Exactly at both limits: accepted.
    expect(() =>
      loadScenario(
        `title: t\nredshifts: [${zs.split(",").slice(0, 1000).join(",")}]\ngrid: { points: 5000 }\nmodels:\n${models(20)}`,
        "t.yaml",
      ),
    ).not.toThrow();
  });
  it("YAML alias bombs are refused", () => {
    const bomb =
      "a: &a [x,x,x,x,x,x,x,x,x]\nb: &b [*a,*a,*a,*a,*a,*a,*a,*a,*a]\nc: &c [*b,*b,*b,*b,*b,*b,*b,*b,*b]\nd: &d [*c,*c,*c,*c,*c,*c,*c,*c,*c]\ne: [*d,*d,*d,*d,*d,*d,*d,*d,*d]\n";
    expect(issuesOf(bomb).some((i) => /alias bomb/.test(i.message))).toBe(true);
  });
  it("__proto__ and constructor keys are rejected as unknown and pollute nothing", () => {
    const issues = issuesOf(`title: t\n__proto__: { polluted: true }\nconstructor: x\nmodels:\n${GOOD_MODEL}`);
    expect(issues.map((i) => i.path).sort()).toEqual(["__proto__", "constructor"]);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
  it("a target placed twice, and a survey with z_max <= z_min", () => {
    const issues = issuesOf(
      "title: t\nmodels:\n" +
        GOOD_MODEL +
        "targets:\n  - { name: x, z: 1, lookback_Gyr: 3 }\nsurveys:\n  - { name: s, area_deg2: 10, z_min: 1, z_max: 0.5 }\n",
    );
    expect(issues.some((i) => i.path === "targets[0]" && /placed twice/.test(i.message))).toBe(true);
    expect(issues.some((i) => i.path === "surveys[0].z_max" && /must be greater than z_min/.test(i.message))).toBe(
      true,
    );
  });
  it("several problems are all reported at once", () => {
    expect(issuesOf("title: t\nmodels:\n  - id: a\n    H0: -1\n    Omega_m: -1\n").length).toBe(2);
  });
});

describe("valid but extreme models compute, with warnings", () => {
  it("recollapse, negative Omega_de and a closed model beyond the antipode load without error", () => {
    const s = loadScenario(
      "title: t\nmodels:\n  - { id: neg, H0: 70, Omega_m: 0.3, Omega_de: -0.2 }\n  - { id: loiter, H0: 70, Omega_m: 0.2, Omega_Lambda: 1.25, radiation: none }\n  - { id: wild, H0: 70, Omega_m: 0.3, w0: -2.5, Omega_de: 0.7 }\n",
      "x.yaml",
    );
    expect(s.models.map((m) => m.id)).toEqual(["neg", "loiter", "wild"]);
    expect(s.models[2].warnings.join(" ")).toMatch(/w0 = -2.5 lies outside/);
  });
});

describe("inheritance and defaults", () => {
  it("a child inherits everything, overrides what it lists, and a curvature key replaces the parent's", () => {
    const s = loadScenario(
      "title: t\nmodels:\n  - { id: ref, H0: 67.5, Omega_m: 0.31, flat: true, N_eff: 3.2 }\n  - { id: closed, extends: ref, Omega_k: -0.02 }\n",
      "x.yaml",
    );
    const c = s.models[1];
    expect(c.inputs).toMatchObject({
      H0: 67.5,
      Omega_m: 0.31,
      curvature_key: "Omega_k",
      curvature_value: -0.02,
      N_eff: 3.2,
      T_cmb: 2.7255,
      w0: -1,
      wa: 0,
    });
    expect(c.provenance).toMatchObject({
      H0: "inherited",
      N_eff: "inherited",
      curvature_value: "set",
      T_cmb: "default",
      w0: "default",
    });
    expect(s.baseline).toBe("ref");
    expect(s.defaults_applied).toEqual(expect.arrayContaining(["baseline", "redshifts", "grid.points"]));
  });
});
