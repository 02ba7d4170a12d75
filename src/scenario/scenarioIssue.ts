/** One thing wrong with a scenario file, located so that a user can go straight to it. */
export interface ScenarioIssue {
  file: string;
  line: number;
  column: number;
  /** Key path such as models[1].H0; "" for the whole file. */
  path: string;
  message: string;
  /** A warning printed beside the errors (it may explain one: H0 = 0.7 looks like h); errors when absent. */
  severity?: "warning";
}

/** Invalid input: carries every issue found; the CLI prints them and exits with status 2. */
export class ScenarioInputError extends Error {
  readonly issues: ScenarioIssue[];
  constructor(issues: ScenarioIssue[]) {
    super(issues.map(formatIssue).join("\n"));
    this.name = "ScenarioInputError";
    this.issues = issues;
  }
}

/** The terminal line of an issue: "error: ..." or "warning: ...". */
export const issueLine = (issue: ScenarioIssue) => `${issue.severity ?? "error"}: ${formatIssue(issue)}`;

/** The problems found and the sentence that closes the list ("2 problems found; ..."), warnings not counted. */
export function issueSummary(issues: ScenarioIssue[], after: string): string {
  const n = issues.filter((i) => i.severity !== "warning").length;
  return `${n} problem${n === 1 ? "" : "s"} found; ${after}`;
}

/** file:line:column: path: message, the form editors and terminals turn into links. */
export function formatIssue(issue: ScenarioIssue): string {
  const where = `${issue.file}:${issue.line}:${issue.column}`;
  return issue.path ? `${where}: ${issue.path}: ${issue.message}` : `${where}: ${issue.message}`;
}

/** Formats a key path from its segments: models[1].H0. */
export function formatPath(segments: readonly (string | number)[]): string {
  let out = "";
  for (const s of segments) {
    if (typeof s === "number") out += `[${s}]`;
    else out += out === "" ? s : `.${s}`;
  }
  return out;
}
