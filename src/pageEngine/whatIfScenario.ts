// The scenario a page's what-if panel computes: the page's own scenario text cut down to what the what-if model
// needs (the baseline, the model it starts from and that model's ancestors, every table redshift, target and survey)
// plus one model of the reader's, written as the block a scenario file would hold (`extends:` the starting point,
// then the changed keys). The same block is what "Copy as YAML" gives, so pasting it into the scenario file makes
// the next build compute exactly these numbers.
import { parse, stringify } from "yaml";
import { PUBLISHED_PREFIX } from "../scenario/publishedSets.js";

/** Where a what-if model starts: a model of the page, or a published parameter set (`extends: published/<id>`). */
export type WhatIfStart = { model: string } | { published: string };

/** Model keys as a scenario file writes them (numbers, `flat: true`, `radiation: none`, neutrino masses). */
export type WhatIfChanges = Record<string, number | string | boolean | number[]>;

export interface WhatIfScenario {
  /** The scenario text that is computed (YAML, the page's scenario cut down, with the what-if model last). */
  text: string;
  /** The what-if model's id (what-if, or what-if-2 ... when the page already has a model of that name). */
  modelId: string;
  /** The what-if model's block, ready to paste under `models:` of the page's scenario file. */
  block: string;
  /** The computed text without the what-if model: the same for every change from one starting point. */
  kept: string;
}

/** The label of the what-if model in the block a reader copies. */
export const WHAT_IF_MODEL_LABEL = "What-if";

/** Scenario keys that change no number of a what-if model: the prose, and the draws of spreads (a what-if has none). */
const LEFT_OUT_SCENARIO_KEYS = ["description", "author", "tags", "draws"];
/** Model keys of the models kept for inheritance that a what-if computation does not need (spread: see below). */
const LEFT_OUT_MODEL_KEYS = ["spread", "label_tex", "notes"];

type RawModel = Record<string, unknown> & { id: string; extends?: string | string[] };

const parentsOf = (m: RawModel): string[] =>
  m.extends === undefined ? [] : Array.isArray(m.extends) ? m.extends : [m.extends];

/** The page's source parsed once (a page asks with the same source at every change); only read, never changed. */
let lastParsed: { source: string; value: Record<string, unknown> } | null = null;
function parsed(source: string): Record<string, unknown> {
  if (lastParsed?.source !== source) lastParsed = { source, value: parse(source) as Record<string, unknown> };
  return lastParsed.value;
}

/**
 * The what-if scenario for a page's scenario source. `source` passed `check` when the page was built; anything
 * the reader adds is checked again when the text is computed.
 */
export function whatIfScenario(
  source: string,
  start: WhatIfStart,
  changes: WhatIfChanges,
  scenarioId?: string,
): WhatIfScenario {
  const raw = parsed(source);
  const models = (Array.isArray(raw.models) ? raw.models : []) as RawModel[];
  const byId = new Map(models.map((m) => [m.id, m]));
  const baseline = typeof raw.baseline === "string" ? raw.baseline : models[0]?.id;

  // The models the what-if needs: the baseline (for the differences) and the start, each with its ancestors.
  const chainOf = (id: string | undefined): Set<string> => {
    const chain = new Set<string>();
    const visit = (x: string) => {
      const m = byId.get(x);
      if (!m || chain.has(x)) return;
      chain.add(x);
      for (const p of parentsOf(m)) if (!p.startsWith(PUBLISHED_PREFIX)) visit(p);
    };
    if (id !== undefined) visit(id);
    return chain;
  };
  const startChain = "model" in start ? chainOf(start.model) : new Set<string>();
  const needed = new Set([...chainOf(baseline), ...startChain]);
  const startRef = "model" in start ? start.model : PUBLISHED_PREFIX + start.published;
  // Whether the starting point carries a spread: one of its chain's own, or a published set's uncertainties.
  const spreadUpstream =
    "published" in start ||
    [...startChain].some((id) => {
      const m = byId.get(id)!;
      return (
        (m.spread !== undefined && m.spread !== "none") || parentsOf(m).some((p) => p.startsWith(PUBLISHED_PREFIX))
      );
    });

  let modelId = "what-if";
  for (let n = 2; byId.has(modelId); n++) modelId = `what-if-${n}`;
  // A spread of the starting point (its own, or a published set's uncertainties) is not inherited: the panel shows
  // the numbers at the parameters given, and the pasted block must mean the same in the scenario file.
  const whatIf: Record<string, unknown> = {
    id: modelId,
    label: WHAT_IF_MODEL_LABEL,
    extends: startRef,
    ...changes,
    ...(spreadUpstream ? { spread: "none" } : {}),
  };

  // Kept models draw nothing either: their own spreads are left out, and those of the published sets they extend
  // are turned off (a spread changes no number of the what-if, only bands the panel does not show).
  const kept = models
    .filter((m) => needed.has(m.id))
    .map((m) => ({
      ...Object.fromEntries(Object.entries(m).filter(([k]) => !LEFT_OUT_MODEL_KEYS.includes(k))),
      spread: "none",
    }));
  // The id is written out: the computed text is named after the scenario file, not as the file (see whatIfFileName).
  const scenario: Record<string, unknown> = raw.id === undefined && scenarioId ? { id: scenarioId } : {};
  for (const [k, v] of Object.entries(raw)) if (!LEFT_OUT_SCENARIO_KEYS.includes(k) && k !== "models") scenario[k] = v;
  if (baseline !== undefined) scenario.baseline = baseline;
  scenario.models = kept;
  const keptText = stringify(scenario);
  scenario.models = [...kept, whatIf];
  return { text: stringify(scenario), modelId, block: stringify([whatIf]), kept: keptText };
}

/** The name problems in the computed text are reported under: the scenario file's name, marked as the what-if's. */
export const whatIfFileName = (file: string) => `${file.replace(/\.ya?ml$/i, "")}.what-if.yaml`;
