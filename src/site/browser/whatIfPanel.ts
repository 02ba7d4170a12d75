// The what-if panel of a scenario page (content/_includes/whatIfPanel.njk). When a reader opens it (or earlier, at
// an idle moment: see warmUp), it loads the engine (assets/what-if-engine.js: the scenario pipeline of `compute`,
// src/pageEngine/whatIfEngine.ts), sends the page's scenario source, the starting point and the changed keys, and
// places what comes back (./whatIfPlacement.ts): the presentation's cells as an extra column of each table, a
// geometry card and a curve on every chart. It formats nothing itself: every text it writes was made by the
// presentation in the engine. Nothing is stored, and the page's downloads and copy buttons never see the what-if.
import type { GeometryCard } from "../../presentation/presentTables.js";
import { clearWhatIf, placeWhatIf, type WhatIfPart } from "./whatIfPlacement.js";

type Result = { text: string; block: string; file: string } & (
  | {
      ok: true;
      label: string;
      tables: Record<string, WhatIfPart>;
      chart: unknown;
      geometry: GeometryCard;
      notes: string[];
      parameters: Record<string, unknown>;
      provenance: Record<string, string>;
    }
  | { ok: false; problems: string[] }
);
type Changes = Record<string, number | string | boolean | number[]>;
interface Engine {
  whatIf(request: {
    source: string;
    file: string;
    id: string;
    start: { model: string } | { published: string };
    changes: Changes;
  }): Result;
}
interface PanelData {
  source: string;
  file: string;
  id: string;
  engine: string;
}

const panel = document.getElementById("what-if");
const dataElement = document.getElementById("what-if-data");
if (panel && dataElement) setUp(panel, JSON.parse(dataElement.textContent ?? "{}") as PanelData);

function setUp(panel: HTMLElement, data: PanelData): void {
  panel.hidden = false;
  for (const link of document.querySelectorAll<HTMLElement>(".what-if-link")) link.hidden = false;
  const q = <T extends Element>(selector: string) => panel.querySelector<T>(selector)!;
  const opener = q<HTMLDetailsElement>("details.what-if-open");
  const start = q<HTMLSelectElement>("#what-if-start");
  const status = q<HTMLElement>(".what-if-status");
  const problems = q<HTMLElement>(".what-if-problems");
  const notes = q<HTMLElement>(".what-if-notes");
  const yaml = q<HTMLElement>(".what-if-yaml");
  const scenarioText = q<HTMLElement>(".what-if-text");
  const fields = [...panel.querySelectorAll<HTMLInputElement | HTMLSelectElement>("[data-key]")];
  const choiceKeys = [...panel.querySelectorAll<HTMLSelectElement>("[data-choice-key]")];
  const choiceValue = (name: string) => q<HTMLInputElement>(`[data-choice-value="${name}"]`);
  /** Inputs the reader changed since the starting point was chosen: only these are written into the model block. */
  const dirty = new Set<string>();
  let engine: Engine | null = null;
  let last: Result | null = null;
  let pending = false;

  const startOf = () => {
    const [kind, id] = start.value.split(/:(.*)/s);
    return kind === "published" ? { published: id } : { model: id };
  };
  /**
   * A number as typed, or the text itself when it is none (a browser's number input holds no text it cannot read:
   * that is written as "(not a number)"), so that the scenario validator names the problem in its own words.
   */
  const typed = (text: string, unreadable = false): number | string => {
    if (unreadable) return "(not a number)";
    const x = Number(text);
    return text.trim() !== "" && Number.isFinite(x) ? x : text;
  };
  /** Only the inputs the reader changed; one emptied again inherits from the starting point (an empty mass list: none). */
  const changes = (): Changes => {
    const out: Changes = {};
    for (const f of fields) {
      const key = f.dataset.key!;
      if (!dirty.has(key) || f.disabled) continue;
      if (f instanceof HTMLSelectElement) out[key] = f.value;
      else if (f.dataset.list === "number")
        out[key] = f.value.trim() === "" ? [] : (f.value.split(",").map((x) => typed(x.trim())) as number[]);
      else if (f.value.trim() !== "" || f.validity.badInput) out[key] = typed(f.value, f.validity.badInput);
    }
    for (const sel of choiceKeys) {
      const name = sel.dataset.choiceKey!;
      if (!dirty.has(name)) continue;
      const value = choiceValue(name);
      if (sel.value === "flat") out.flat = true;
      else if (value.value.trim() !== "" || value.validity.badInput)
        out[sel.value] = typed(value.value, value.validity.badInput);
    }
    return out;
  };

  const numbered = (text: string) =>
    text
      .replace(/\n$/, "")
      .split("\n")
      .map((l, i) => `${String(i + 1).padStart(3)}  ${l}`)
      .join("\n");
  const listInto = (element: HTMLElement, lines: string[]) => {
    element.replaceChildren();
    if (lines.length === 0) return;
    const ul = document.createElement("ul");
    for (const l of lines) {
      const li = document.createElement("li");
      li.textContent = l;
      ul.append(li);
    }
    element.append(ul);
  };

  const markInvalid = (lines: string[]) => {
    const keys = new Set(lines.flatMap((l) => [...l.matchAll(/models\[\d+\]\.(\w+)/g)].map((m) => m[1])));
    for (const f of panel.querySelectorAll<HTMLElement>("input, select")) {
      const key =
        f.dataset.key ??
        (f.dataset.choiceValue ? q<HTMLSelectElement>(`[data-choice-key="${f.dataset.choiceValue}"]`).value : "");
      if (keys.has(key)) {
        f.setAttribute("aria-invalid", "true");
        f.setAttribute("aria-errormessage", "what-if-problems");
      } else {
        f.removeAttribute("aria-invalid");
        f.removeAttribute("aria-errormessage");
      }
    }
  };

  /** The starting point's values in the inputs (the resolved inputs of the what-if as computed without changes). */
  const fill = (parameters: Record<string, unknown>, provenance: Record<string, string>) => {
    for (const f of fields) {
      const key = f.dataset.key!;
      const v = parameters[key];
      if (Array.isArray(v)) f.value = v.join(", ");
      else f.value = v === undefined || v === null ? "" : String(v);
    }
    const curvatureFrom = String(parameters.curvature_from ?? "flat");
    const baryonKey =
      provenance.omega_b && provenance.omega_b !== "derived"
        ? "omega_b"
        : provenance.Omega_b && provenance.Omega_b !== "derived"
          ? "Omega_b"
          : "omega_b";
    for (const sel of choiceKeys) {
      const name = sel.dataset.choiceKey!;
      const key = name === "curvature" ? curvatureFrom : baryonKey;
      if ([...sel.options].some((o) => o.value === key)) sel.value = key;
      const v = parameters[sel.value];
      choiceValue(name).value = typeof v === "number" ? String(v) : "";
    }
    syncDisabled();
  };

  const syncDisabled = () => {
    for (const sel of choiceKeys) {
      const name = sel.dataset.choiceKey!;
      choiceValue(name).disabled = sel.value === "flat";
      for (const r of panel.querySelectorAll<HTMLElement>(`#what-if-${name}-range [data-range-of]`))
        r.hidden = r.dataset.rangeOf !== sel.value;
    }
    const radiation = panel.querySelector<HTMLSelectElement>('[data-key="radiation"]');
    for (const key of ["T_cmb", "N_eff"]) {
      const input = panel.querySelector<HTMLInputElement>(`[data-key="${key}"]`);
      if (input && radiation) input.disabled = radiation.value === "none";
    }
  };

  let runs = 0;
  const run = (refill: boolean) => {
    pending = false;
    if (!engine) return;
    // How many computations the panel has made (data-runs): what a reader's tools and the tests wait on.
    panel.dataset.runs = String(++runs);
    const t0 = performance.now();
    let result: Result;
    try {
      result = engine.whatIf({
        source: data.source,
        file: data.file,
        id: data.id,
        start: startOf(),
        changes: changes(),
      });
    } catch (e) {
      // Not a problem of the reader's input (those come back located): the engine itself failed. The page says so,
      // keeps no stale numbers, and the console has the details.
      console.error(e);
      clearWhatIf();
      last = null;
      listInto(problems, [`The engine stopped without an answer (${(e as Error).message}); nothing was computed.`]);
      status.textContent = "Not computed.";
      panel.dataset.state = "failed";
      return;
    }
    last = result;
    clearWhatIf();
    yaml.textContent = result.block;
    scenarioText.textContent = numbered(result.text);
    q<HTMLElement>(".what-if-file").textContent = result.file;
    if (!result.ok) {
      listInto(problems, result.problems);
      markInvalid(result.problems);
      notes.replaceChildren();
      status.textContent = "Not computed: see the problems below (the words of cosmoledger check).";
      panel.dataset.state = "problems";
      return;
    }
    problems.replaceChildren();
    markInvalid([]);
    if (refill) fill(result.parameters, result.provenance);
    placeWhatIf(result);
    notes.replaceChildren(
      ...result.notes.map((n) => {
        const li = document.createElement("li");
        li.textContent = n;
        return li;
      }),
    );
    const ms = performance.now() - t0;
    performance.measure("cosmoledger what-if", { start: t0, duration: ms });
    status.textContent = `${result.label}: computed in this page (${Math.max(1, Math.round(ms))} ms).`;
    panel.dataset.state = "computed";
  };
  const schedule = () => {
    if (pending) return;
    pending = true;
    setTimeout(() => run(false), 0);
  };

  /** The engine, its script loaded once: on opening the panel, or earlier by the warm-up below. */
  let loading: Promise<Engine> | null = null;
  const engineLoaded = (): Promise<Engine> => {
    loading ??= new Promise<Engine>((resolve, reject) => {
      const w = window as unknown as { cosmoledgerWhatIfEngine?: Engine };
      if (w.cosmoledgerWhatIfEngine) return resolve(w.cosmoledgerWhatIfEngine);
      const script = document.createElement("script");
      script.src = data.engine;
      script.addEventListener("load", () =>
        w.cosmoledgerWhatIfEngine ? resolve(w.cosmoledgerWhatIfEngine) : reject(new Error("no engine")),
      );
      script.addEventListener("error", () => reject(new Error("not loaded")));
      document.head.append(script);
    });
    return loading;
  };
  const open = () => {
    if (engine) return;
    if (panel.dataset.warm !== "ready") status.textContent = "Loading the engine…";
    engineLoaded().then(
      (e) => {
        engine = e;
        run(true);
      },
      () => {
        status.textContent = `The engine (${data.engine}) could not be loaded.`;
      },
    );
  };
  /**
   * Warm-up: once the page has loaded and the browser is idle, the engine is loaded and the first starting point
   * computed in the background (nothing is shown), so that opening the panel answers at once: the first
   * computation of a page builds the engine's tables (the Fermi-Dirac integrals of massive neutrinos) and compiles
   * its code. Not on a connection that asks to save data; at once when the reader moves to the panel.
   */
  const warmUp = () => {
    if (panel.dataset.warm) return;
    panel.dataset.warm = "started";
    engineLoaded().then(
      (e) => {
        const compute = () => {
          if (!engine) e.whatIf({ source: data.source, file: data.file, id: data.id, start: startOf(), changes: {} });
          panel.dataset.warm = "ready";
        };
        const idle = (window as unknown as { requestIdleCallback?: (f: () => void, o: object) => void })
          .requestIdleCallback;
        if (idle) idle(compute, { timeout: 2000 });
        else setTimeout(compute, 0);
      },
      () => {
        panel.dataset.warm = "failed";
      },
    );
  };
  const saveData = (navigator as unknown as { connection?: { saveData?: boolean } }).connection?.saveData === true;
  if (!saveData) {
    const idle = (window as unknown as { requestIdleCallback?: (f: () => void, o: object) => void })
      .requestIdleCallback;
    const later = () => (idle ? idle(warmUp, { timeout: 5000 }) : setTimeout(warmUp, 1000));
    if (document.readyState === "complete") later();
    else window.addEventListener("load", later, { once: true });
  }
  panel.addEventListener("pointerenter", warmUp, { once: true });
  panel.addEventListener("focusin", warmUp, { once: true });

  opener.addEventListener("toggle", () => {
    if (opener.open) open();
  });
  panel.addEventListener("input", (e) => {
    const t = e.target as HTMLElement;
    if (t === start) return;
    const key = t.dataset.key ?? t.dataset.choiceKey ?? t.dataset.choiceValue;
    if (!key) return;
    dirty.add(key);
    if (t instanceof HTMLSelectElement && t.dataset.choiceKey && last?.ok) {
      // A curvature (baryon) key chosen anew starts from the model's current value of it (derived ones included).
      const v = last.parameters[t.value];
      choiceValue(t.dataset.choiceKey).value = typeof v === "number" ? String(v) : "";
    }
    if (t instanceof HTMLSelectElement) syncDisabled();
    schedule();
  });
  start.addEventListener("change", () => {
    dirty.clear();
    run(true);
  });
  panel.querySelector('[data-what-if="reset"]')?.addEventListener("click", () => {
    dirty.clear();
    run(true);
  });
  panel.querySelector('[data-what-if="remove"]')?.addEventListener("click", () => {
    clearWhatIf();
    dirty.clear();
    opener.open = false;
    // The button is now hidden with the panel's body: the keyboard goes back to the panel's summary.
    opener.querySelector("summary")?.focus();
    status.textContent = "The what-if was removed from the page.";
    panel.dataset.state = "removed";
  });
  panel.querySelector('[data-what-if="copy"]')?.addEventListener("click", () => {
    if (!last) return;
    const text = last.block;
    const done = (ok: boolean) => {
      status.textContent = ok
        ? "The model block is on the clipboard: paste it under models: in the scenario file."
        : "Copying was refused by the browser: select the model block below and copy it.";
    };
    if (navigator.clipboard?.writeText)
      navigator.clipboard.writeText(text).then(
        () => done(true),
        () => done(false),
      );
    else done(false);
  });
  panel.querySelector("form")?.addEventListener("submit", (e) => e.preventDefault());
}
