import { linkSync, rmSync, writeFileSync } from "node:fs";
import { basename, dirname, join } from "node:path";
import { FILE_SYSTEM_EXIT, fileSystemRefusal } from "./fileSystemRefusal.js";
import { parseArgs } from "node:util";
import { closest } from "fastest-levenshtein";
import { parseDocument } from "yaml";
import { loadScenario, loadScenarioData } from "../scenario/loadScenario.js";
import { ScenarioInputError, issueLine, type ScenarioIssue } from "../scenario/scenarioIssue.js";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";
import type { TablesDocument } from "../contract/tablesDocument.js";
import { TOOL_VERSION } from "../common/toolVersion.js";
import { displayPath } from "../common/displayPath.js";
import { tableCsv, tableJson, tableLatex, tableMarkdown } from "../exports/exportFormats.js";
import type { ExportProvenance } from "../exports/exportProvenance.js";
import { locatedTables } from "../tables/locatedTables.js";
import { attachmentReader, loadScenarioFile } from "./readScenarioFile.js";
import { DEFAULT_QUOTE_QUANTITIES, UnknownQuantityError, resolveQuantities } from "./quoteQuantities.js";
import {
  PLACEMENT_OPTIONS,
  QuoteArgumentError,
  parseInlineModel,
  parseNumberList,
  parseNumberTexts,
  quoteScenario,
  quoteTargets,
  type InlineModel,
  type Placement,
  type TargetExtras,
} from "./quoteRequest.js";
import { QUOTE_HELP } from "./quoteHelp.js";
import { quoteSections, quoteTable, quoteTerminal, type QuoteSources } from "./quoteOutput.js";
import { reportWarnings } from "./scenarioWarnings.js";
import { scenarioWarnings } from "../tables/scenarioWarnings.js";
import { choicesOf, presentDocument } from "../presentation/presentDocument.js";

const FORMATS = ["table", "csv", "json", "md", "tex"] as const;

/** Maps an issue of the generated scenario back to the argument that caused it. */
function issueArgument(issue: ScenarioIssue, models: InlineModel[], placements: Placement[], extras: TargetExtras) {
  const m = /^models\[(\d+)\](?:\.(.*))?$/.exec(issue.path);
  if (m) {
    const model = models[Number(m[1])];
    return `--model "${model?.argument ?? "?"}"${m[2] ? `: ${m[2]}` : ""}`;
  }
  const z = /^redshifts\[(\d+)\]/.exec(issue.path);
  if (z) return `--z ${placements.filter((p) => p.by === "z")[Number(z[1])]?.value}`;
  const t = /^targets\[(\d+)\]/.exec(issue.path);
  if (t) {
    const withExtras = Object.keys(extras).length > 0;
    return placements.filter((p) => withExtras || p.by !== "z")[Number(t[1])]?.argument ?? "a placement";
  }
  return issue.path || "quote";
}

/** The scenario file's text with the placements in place of its redshifts, targets and surveys. */
function derivedFromFile(text: string, placements: Placement[], extras: TargetExtras): string {
  const doc = parseDocument(text);
  const zs = placements.filter((p) => p.by === "z").map((p) => p.value);
  if (zs.length > 0) {
    const list = doc.createNode(zs);
    list.flow = true; // one line, as scenario files write their redshifts
    doc.set("redshifts", list);
  }
  const targets = quoteTargets(placements, extras);
  if (targets.length > 0) doc.set("targets", targets);
  else doc.delete("targets");
  doc.delete("surveys");
  return String(doc);
}

export async function quoteCommand(argv: string[]): Promise<number> {
  const fail = (argument: string, problem: string) => {
    process.stderr.write(`cosmoledger quote: ${argument}: ${problem}\n`);
    return 2;
  };
  let parsed: ReturnType<typeof parseQuoteArgs>;
  try {
    parsed = parseQuoteArgs(argv);
  } catch (e) {
    return fail("arguments", `${(e as Error).message}; see cosmoledger quote --help`);
  }
  const { values: o, positionals } = parsed;
  if (o.help) {
    process.stdout.write(`${QUOTE_HELP}\n`);
    return 0;
  }
  try {
    const format = o.format ?? "table";
    if (!(FORMATS as readonly string[]).includes(format))
      throw new QuoteArgumentError(`--format ${format}`, `valid formats are ${FORMATS.join(", ")}`);
    const models = (o.model ?? []).map(parseInlineModel);
    if (positionals.length > 1) throw new QuoteArgumentError(positionals.join(" "), "name at most one scenario file");
    const file = positionals[0];
    if (file && models.length > 0)
      throw new QuoteArgumentError(`${file} and --model`, "give either a scenario file or --model, not both");
    if (!file && models.length === 0)
      throw new QuoteArgumentError("models", 'name a model, e.g. --model "H0=70 Omega_m=0.3", or a scenario file');
    if (!file && o.models) throw new QuoteArgumentError(`--models ${o.models}`, "--models needs a scenario file");
    const placements: Placement[] = [];
    for (const [option, { by }] of Object.entries(PLACEMENT_OPTIONS)) {
      const texts = (o as Record<string, string[] | undefined>)[option] ?? [];
      // Each placement keeps only its own value's text (never the whole list: cost linear in the values given).
      for (const x of parseNumberTexts(option, texts))
        placements.push({ by, value: x.value, argument: `--${option} ${x.text}` });
    }
    const extras: TargetExtras = {};
    const extraOptions = [
      ["size-kpc", "size_kpc"],
      ["abs-mag", "absolute_magnitude"],
      ["luminosity-erg-s", "luminosity_erg_s"],
    ] as const;
    for (const [option, key] of extraOptions) {
      const v = (o as Record<string, string | undefined>)[option];
      if (v !== undefined) extras[key] = parseNumberList(option, [v])[0];
    }
    if (extras.absolute_magnitude !== undefined && extras.luminosity_erg_s !== undefined)
      throw new QuoteArgumentError("--abs-mag and --luminosity-erg-s", "give one of them, not both");
    const named = (o.quantities ?? []).flatMap((q) => q.split(",").map((s) => s.trim())).filter((s) => s !== "");
    const quantities = resolveQuantities(named.length > 0 ? named : DEFAULT_QUOTE_QUANTITIES);
    if (placements.length === 0 && quantities.some((q) => !q.summary))
      throw new QuoteArgumentError(
        "placements",
        "say where to quote: --z 0.5,1,2, --lookback-Gyr, --age-Gyr or --distance-Mpc (or only today's quantities)",
      );
    const needsExtra = quantities.find((q) => !q.row && q.target && !q.summary && Object.keys(extras).length === 0);
    if (needsExtra)
      throw new QuoteArgumentError(
        `--quantities ${needsExtra.short}`,
        "needs --size-kpc (angular size), --abs-mag or --luminosity-erg-s (magnitude, flux)",
      );

    // The equivalent scenario, resolved exactly as compute would resolve it.
    const command = `cosmoledger quote ${argv.map((a) => (/\s/.test(a) ? `"${a}"` : a)).join(" ")}`;
    let text: string;
    let scenario: ResolvedScenario;
    let shown: string[];
    if (file) {
      const loaded = loadScenarioFile(file);
      if (loaded.scenario === null) {
        for (const i of loaded.issues) process.stderr.write(`${issueLine(i)}\n`);
        return 2;
      }
      const ids = loaded.scenario.models.map((m) => m.id);
      shown = o.models ? o.models.split(",").map((s) => s.trim()) : ids;
      for (const id of shown)
        if (!ids.includes(id))
          throw new QuoteArgumentError(
            `--models ${o.models}`,
            `${displayPath(file)} has no model "${id}" (did you mean ${closest(id, ids)}?); its models: ${ids.join(", ")}`,
          );
      text = derivedFromFile(loaded.scenario.source.text, placements, extras);
      // Samples files are read beside the scenario file, as compute reads them.
      scenario = loadInline(
        text,
        loaded.scenario.source.path,
        models,
        placements,
        extras,
        undefined,
        attachmentReader(file),
      );
    } else {
      const quoted = quoteScenario(models, placements, extras, command);
      text = quoted.text;
      scenario = loadInline(text, "quote.yaml", models, placements, extras, quoted.data);
      shown = scenario.models.map((m) => m.id);
    }
    const doc = computeQuoted(scenario, models, placements, extras);
    // The same warnings, in the same words, as check prints for this scenario; under --strict they stop the quote.
    if (reportWarnings(scenarioWarnings(scenario, doc), o.strict ?? false)) return 2;
    const presented = presentDocument(doc);
    const sources: QuoteSources = { presented, solvedRows: solvedRows(scenario, doc, placements) };
    const everyPlacementIsATarget = Object.keys(extras).length > 0;
    const sections = quoteSections(sources, shown, placements, quantities, everyPlacementIsATarget);
    const columns = shown.map((id, i) => {
      const m = doc.models.find((x) => x.id === id)!;
      return { id, label: file ? m.label : (models[i]?.argument ?? m.label), cites: citations(m.published ?? []) };
    });
    const provenance: ExportProvenance = {
      tool: "cosmoledger",
      tool_version: TOOL_VERSION,
      scenario_id: doc.scenario.id,
      scenario_title: doc.scenario.title,
      version: null,
      version_sha256: null,
      inputs_sha256: doc.scenario.inputs_sha256,
      engine_version: doc.engine.version,
      page: "(cosmoledger quote; not on a site)",
    };
    const table = quoteTable(sections, columns, presented);
    const out =
      format === "csv"
        ? tableCsv(table, provenance)
        : format === "json"
          ? tableJson(table, provenance)
          : format === "md"
            ? tableMarkdown(table, provenance)
            : format === "tex"
              ? tableLatex(table, provenance)
              : quoteTerminal(sections, columns, provenance, presented);
    if (o.save) {
      const refused = saveNew(o.save, text);
      if (refused === "exists")
        throw new QuoteArgumentError(`--save ${o.save}`, "the file exists; quote never overwrites: choose a new name");
      if (refused) {
        process.stderr.write(`cosmoledger quote: --save ${o.save}: ${refused}; nothing was written\n`);
        return FILE_SYSTEM_EXIT;
      }
    }
    process.stdout.write(out.endsWith("\n") ? out : `${out}\r\n`);
    if (o.save) process.stderr.write(`wrote ${displayPath(o.save)} (compute it with: cosmoledger compute ${o.save})\n`);
    return 0;
  } catch (e) {
    if (e instanceof QuoteArgumentError) return fail(e.argument, e.problem);
    if (e instanceof UnknownQuantityError) return fail("--quantities", e.message);
    if (e instanceof QuoteScenarioError) {
      for (const line of e.lines) process.stderr.write(`cosmoledger quote: ${line}\n`);
      return 2;
    }
    throw e;
  }
}

/**
 * Writes a new file whole or not at all: the text goes to a temporary file beside it, which is then linked to the
 * name (link fails if the name exists, so nothing is overwritten) and removed. A full disk leaves no empty file
 * behind, so the same command can be run again. Returns "exists", why the system refused, or null when written.
 */
function saveNew(path: string, text: string): "exists" | string | null {
  const temporary = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
  try {
    writeFileSync(temporary, text, { flag: "wx" });
    linkSync(temporary, path);
    return null;
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === "EEXIST" && (e as NodeJS.ErrnoException).syscall === "link") return "exists";
    if (fileSystemRefusal(e) === null) throw e;
    return `the file system refused to write it (${code}${code === "ENOSPC" || code === "EDQUOT" ? ": no space left; free some space or save elsewhere" : ": check the folder's permissions or save elsewhere"})`;
  } finally {
    try {
      rmSync(temporary, { force: true });
    } catch {
      // nothing to remove where nothing could be written (a file in the way of the folder)
    }
  }
}

class QuoteScenarioError extends Error {
  constructor(readonly lines: string[]) {
    super(lines.join("\n"));
  }
}

function mapIssues(e: ScenarioInputError, models: InlineModel[], placements: Placement[], extras: TargetExtras) {
  return new QuoteScenarioError(
    e.issues.map((i) => `${issueArgument(i, models, placements, extras)}: ${i.message.replace(/^model \S+: /, "")}`),
  );
}

function loadInline(
  text: string,
  name: string,
  models: InlineModel[],
  placements: Placement[],
  extras: TargetExtras,
  data?: unknown,
  readAttachment?: (relative: string) => string,
): ResolvedScenario {
  try {
    return data === undefined
      ? loadScenario(text, name, readAttachment ? { readAttachment } : {})
      : loadScenarioData(data, text, name);
  } catch (e) {
    if (e instanceof ScenarioInputError) throw mapIssues(e, models, placements, extras);
    throw e;
  }
}

function computeQuoted(
  s: ResolvedScenario,
  models: InlineModel[],
  placements: Placement[],
  extras: TargetExtras,
): TablesDocument {
  try {
    return locatedTables(s, { chartGrid: false });
  } catch (e) {
    if (e instanceof ScenarioInputError) throw mapIssues(e, models, placements, extras);
    throw e;
  }
}

/**
 * For placements by lookback time, age or distance: each model's redshift row at the redshift its target was solved
 * to, so that every per-redshift quantity can be quoted there (computed as compute computes a table redshift).
 */
function solvedRows(s: ResolvedScenario, doc: TablesDocument, placements: Placement[]): QuoteSources["solvedRows"] {
  const out: QuoteSources["solvedRows"] = new Map();
  if (placements.every((p) => p.by === "z")) return out;
  const zs = new Set<number>();
  for (const m of doc.models) for (const t of m.targets) if (t.z !== null) zs.add(t.z);
  if (zs.size === 0) return out;
  const list = [...zs].sort((a, b) => a - b);
  // Presented as the quote's own document is, so that a solved row shows the same units.
  const again = presentDocument(
    locatedTables({ ...s, redshifts: list, targets: [], surveys: [] }, { chartGrid: false }),
    choicesOf(doc),
  ).doc;
  for (const m of doc.models) {
    const rows = again.models.find((x) => x.id === m.id)!.redshifts;
    let t = 0;
    const withExtras = m.targets.length === placements.length;
    out.set(
      m.id,
      placements.map((p) => {
        if (p.by === "z" && !withExtras) return null;
        const target = m.targets[t++];
        if (p.by === "z" || !target || target.z === null) return null;
        return rows[list.indexOf(target.z)] ?? null;
      }),
    );
  }
  return out;
}

function parseQuoteArgs(argv: string[]) {
  return parseArgs({
    args: argv,
    allowPositionals: true,
    options: {
      model: { type: "string", multiple: true },
      models: { type: "string" },
      z: { type: "string", multiple: true },
      "lookback-Gyr": { type: "string", multiple: true },
      "age-Gyr": { type: "string", multiple: true },
      "distance-Mpc": { type: "string", multiple: true },
      "size-kpc": { type: "string" },
      "abs-mag": { type: "string" },
      "luminosity-erg-s": { type: "string" },
      quantities: { type: "string", multiple: true },
      format: { type: "string" },
      save: { type: "string" },
      strict: { type: "boolean" },
      help: { type: "boolean", short: "h" },
    },
  });
}

/** The published sets a model extends, cited on one line each (with the values not yet checked against the table). */
function citations(sets: NonNullable<TablesDocument["models"][number]["published"]>): string[] {
  return sets.map((p) => {
    const memo = Object.entries(p.transcription)
      .filter(([, how]) => how === "recalled from memory")
      .map(([k]) => k);
    return `${p.title}: ${p.journal}, arXiv:${p.arxiv}, ${p.table}${memo.length ? `; ${memo.join(", ")} not yet checked against the published table` : ""}`;
  });
}
