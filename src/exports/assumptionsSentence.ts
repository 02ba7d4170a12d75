import { oneLine } from "../common/userText.js";
import { hasEarlyUniverse } from "../contract/quantityCatalog.js";
import type {
  ModelSpread as ModelSpreadOf,
  StoredModelTables,
  StoredTablesDocument,
} from "../contract/tablesDocument.js";

type PublishedReference = NonNullable<Extract<StoredModelTables, { published?: unknown }>["published"]>[number];
import { escapeLatex } from "./exportFormats.js";
import { provenanceLine, versionLabel, type ExportProvenance } from "./exportProvenance.js";

/** How a parameter is written in prose and in LaTeX (trade notation). */
const SYMBOL: Record<string, { plain: string; tex: string; unit?: string; texUnit?: string }> = {
  H0: { plain: "H0", tex: "H_0", unit: "km/s/Mpc", texUnit: "\\,\\mathrm{km\\,s^{-1}\\,Mpc^{-1}}" },
  Omega_m: { plain: "Omega_m", tex: "\\Omega_\\mathrm{m}" },
  Omega_k: { plain: "Omega_k", tex: "\\Omega_k" },
  Omega_de: { plain: "Omega_de", tex: "\\Omega_\\mathrm{DE}" },
  Omega_Lambda: { plain: "Omega_Lambda", tex: "\\Omega_\\Lambda" },
  w0: { plain: "w0", tex: "w_0" },
  wa: { plain: "wa", tex: "w_a" },
  Omega_b: { plain: "Omega_b", tex: "\\Omega_\\mathrm{b}" },
  omega_b: { plain: "omega_b", tex: "\\omega_\\mathrm{b}" },
  T_cmb: { plain: "T_cmb", tex: "T_\\mathrm{CMB}", unit: "K", texUnit: "\\,\\mathrm{K}" },
  N_eff: { plain: "N_eff", tex: "N_\\mathrm{eff}" },
};

interface Piece {
  plain: string;
  tex: string;
}
const texNumber = (x: number) => {
  const [m, e] = String(x).split("e");
  return e === undefined ? m : `${m}\\times10^{${Number(e)}}`;
};
const assign = (key: string, x: number): Piece => {
  const s = SYMBOL[key];
  return {
    plain: `${s.plain} = ${x}${s.unit ? ` ${s.unit}` : ""}`,
    tex: `$${s.tex} = ${texNumber(x)}${s.texUnit ?? ""}$`,
  };
};

/** The inputs of one model that have the given provenance, in a fixed order. */
function inputs(m: StoredModelTables, provenance: "set" | "default" | "inherited"): Piece[] {
  const out: Piece[] = [];
  const pv = m.provenance;
  const p = m.parameters;
  if (pv.H0 === provenance) out.push(assign("H0", p.H0));
  if (pv.Omega_m === provenance) out.push(assign("Omega_m", p.Omega_m));
  if (pv.curvature_from === provenance) {
    if (p.curvature_from === "flat") out.push({ plain: "spatially flat", tex: "spatially flat" });
    else if (p.curvature_from === "Omega_k") out.push(assign("Omega_k", p.Omega_k));
    else out.push(assign(p.curvature_from, p.Omega_de));
  }
  if (pv.w0 === provenance) out.push(assign("w0", p.w0));
  if (pv.wa === provenance) out.push(assign("wa", p.wa));
  if (pv.Omega_b === provenance && p.Omega_b !== null) out.push(assign("Omega_b", p.Omega_b));
  if (pv.omega_b === provenance && p.omega_b !== null) out.push(assign("omega_b", p.omega_b));
  if (pv.m_nu_eV === provenance) {
    const ms = p.m_nu_eV;
    out.push(
      ms.length === 0
        ? { plain: "massless neutrinos", tex: "massless neutrinos" }
        : {
            plain: `massive neutrino${ms.length === 1 ? "" : "s"} of ${ms.join(", ")} eV`,
            tex: `massive neutrino${ms.length === 1 ? "" : "s"} of $${ms.join(", ")}\\,\\mathrm{eV}$`,
          },
    );
  }
  if (pv.radiation === provenance)
    out.push(
      p.radiation === "none"
        ? { plain: "no radiation", tex: "no radiation" }
        : { plain: "thermal radiation", tex: "thermal radiation" },
    );
  if (pv.T_cmb === provenance && p.T_cmb !== null) out.push(assign("T_cmb", p.T_cmb));
  if (pv.N_eff === provenance && p.N_eff !== null) out.push(assign("N_eff", p.N_eff));
  return out;
}

/** A published set as a parent, with its citation (the methods sentence cites; how values were checked goes apart). */
function publishedCitation(p: PublishedReference): Piece {
  const who = p.authors.split(/[,:]/)[0];
  const plain = `the published set "${oneLine(p.title)}" (${who} ${p.year}, ${p.journal}, arXiv:${p.arxiv}, ${p.table})`;
  return { plain, tex: escapeLatex(plain) };
}

/**
 * For the authors, not for the methods text: which values of the published sets the sentence cites were transcribed
 * from a paper's table but not yet checked against it, one sentence per set.
 */
export function transcriptionNotes(doc: StoredTablesDocument): string[] {
  const seen = new Set<string>();
  const out: string[] = [];
  for (const m of doc.models)
    for (const p of ("published" in m ? m.published : undefined) ?? []) {
      if (seen.has(p.id)) continue;
      seen.add(p.id);
      const unchecked = Object.entries(p.transcription)
        .filter(([, how]) => how === "recalled from memory")
        .map(([k]) => k);
      if (unchecked.length > 0)
        out.push(
          `${unchecked.join(", ")} of "${oneLine(p.title)}" were transcribed from ${p.table} of arXiv:${p.arxiv} and are not yet checked against the published table; check them there before citing.`,
        );
    }
  return out;
}

/** A model's spread in words, with its draws. */
function spreadPiece(s: ModelSpreadOf): Piece {
  const rejected = s.rejected > 0 ? `, ${s.rejected} rejected` : "";
  const plain = `; spread: ${oneLine(s.description)} (${s.accepted} of ${s.draws} draws used${rejected})`;
  return { plain, tex: escapeLatex(plain) };
}

/** Model labels are quoted, since they may hold commas. */
const quoted = (label: string): Piece => ({ plain: `"${oneLine(label)}"`, tex: `\`\`${escapeLatex(label)}''` });
const join = (xs: Piece[], sep = ", "): Piece => ({
  plain: xs.map((x) => x.plain).join(sep),
  tex: xs.map((x) => x.tex).join(sep),
});

/**
 * The assumptions behind a page, as one paragraph for the methods section of a proposal or paper, in plain text and
 * in LaTeX: every model with the parameters set in it, the defaults that were applied, the methods, the tool and
 * engine versions, and the scenario's version and hash.
 */
export function assumptionsSentence(doc: StoredTablesDocument, p: ExportProvenance): { plain: string; tex: string } {
  const labelOf = (id: string) => doc.models.find((m) => m.id === id)?.label ?? id;
  const models = doc.models.map((m) => {
    const set = inputs(m, "set");
    const parents = m.extends === null ? [] : Array.isArray(m.extends) ? m.extends : [m.extends];
    const published = ("published" in m ? m.published : undefined) ?? [];
    const parentPieces = parents.map((ref): Piece => {
      const set = published.find((p) => `published/${p.id}` === ref);
      return set ? publishedCitation(set) : quoted(labelOf(ref));
    });
    const base = parentPieces.length
      ? { plain: `as ${join(parentPieces, " then ").plain} but `, tex: `as ${join(parentPieces, " then ").tex} but ` }
      : { plain: "", tex: "" };
    const body = set.length ? join(set) : { plain: "no parameter of its own", tex: "no parameter of its own" };
    const baseline = m.id === doc.scenario.baseline ? " (baseline)" : "";
    const spread = "spread" in m && m.spread ? spreadPiece(m.spread) : { plain: "", tex: "" };
    return {
      plain: `${quoted(m.label).plain}${baseline}: ${base.plain}${body.plain}${spread.plain}`,
      tex: `${quoted(m.label).tex}${baseline}: ${base.tex}${body.tex}${spread.tex}`,
    };
  });
  // Defaults: each default once, with the models it applies to; defaults shared by the same models go together.
  const byPiece = new Map<string, { piece: Piece; models: string[] }>();
  for (const m of doc.models) {
    for (const d of inputs(m, "default")) {
      const entry = byPiece.get(d.plain) ?? { piece: d, models: [] };
      entry.models.push(m.label);
      byPiece.set(d.plain, entry);
    }
  }
  const groups = new Map<string, { pieces: Piece[]; models: string[] }>();
  for (const { piece, models } of byPiece.values()) {
    const key = models.join("\u0000");
    const g = groups.get(key) ?? { pieces: [], models };
    g.pieces.push(piece);
    groups.set(key, g);
  }
  const defaults: Piece[] = [...groups.values()].map((g) => {
    const where =
      doc.models.length === 1
        ? ""
        : g.models.length === doc.models.length
          ? " in every model"
          : ` in ${g.models.map((l) => quoted(l).plain).join(", ")}`;
    const texWhere =
      doc.models.length === 1
        ? ""
        : g.models.length === doc.models.length
          ? " in every model"
          : ` in ${g.models.map((l) => quoted(l).tex).join(", ")}`;
    return { plain: `${join(g.pieces).plain}${where}`, tex: `${join(g.pieces).tex}${texWhere}` };
  });
  const early = hasEarlyUniverse(doc);
  // The neutrino treatment, named where any model has a massive species (README, "Massive neutrinos").
  const massive = doc.models.some((m) => m.parameters.m_nu_eV.length > 0);
  const neutrinos = massive
    ? {
        plain:
          "Each massive neutrino species carries N_eff/3 of the relativistic neutrino density and follows the exact Fermi-Dirac integrals at an effective temperature chosen so that Omega_nu h^2 = sum m / 93.14 eV when non-relativistic (Mangano et al. 2005); the remaining N_eff share is massless radiation, and Omega_m includes the massive neutrinos today.",
        tex: String.raw`Each massive neutrino species carries $N_\mathrm{eff}/3$ of the relativistic neutrino density and follows the exact Fermi--Dirac integrals at an effective temperature chosen so that $\Omega_\nu h^2 = \sum m_\nu / 93.14\,\mathrm{eV}$ when non-relativistic (Mangano et al.\ 2005); the remaining share of $N_\mathrm{eff}$ is massless radiation, and $\Omega_m$ includes the massive neutrinos today.`,
      }
    : null;
  // Format 6 on: the linear growth is part of the tables.
  const growth = doc.models.some((m) => "growth_factor" in m.grid);
  const version =
    p.version === null
      ? `an unfrozen draft (inputs SHA-256 ${p.inputs_sha256})`
      : `${versionLabel(p)} (SHA-256 ${p.version_sha256})`;
  const plain = [
    `Background quantities were computed for ${doc.models.length} FLRW model${doc.models.length === 1 ? "" : "s"} of the scenario "${oneLine(doc.scenario.title)}": ${models.map((m) => m.plain).join("; ")}.`,
    defaults.length ? `Defaults applied: ${defaults.map((d) => d.plain).join("; ")}.` : "No defaults were applied.",
    `Curvature follows from the closure relation; integrals were evaluated by adaptive Gauss-Kronrod quadrature to a relative tolerance of ${doc.engine.tolerance}.`,
    neutrinos?.plain ?? "",
    early
      ? "Recombination and drag redshifts come from the fitting formulas of Hu & Sugiyama (1996) and Eisenstein & Hu (1998), and r_drag from the calibrated formula of Aubourg et al. (2015)."
      : "",
    growth
      ? `${GROWTH_SENTENCE} Nonlinear structure, lensing and peculiar velocities are not included.`
      : "The model is the homogeneous background only: perturbations, lensing and peculiar velocities are not included.",
    `Computed with cosmoledger ${p.tool_version} (engine ${doc.engine.version}); scenario ${doc.scenario.id}, ${version}.`,
  ]
    .filter(Boolean)
    .join(" ");
  const tex = [
    `Background quantities were computed for ${doc.models.length} FLRW model${doc.models.length === 1 ? "" : "s"} of the scenario \`\`${escapeLatex(doc.scenario.title)}'': ${models.map((m) => m.tex).join("; ")}.`,
    defaults.length ? `Defaults applied: ${defaults.map((d) => d.tex).join("; ")}.` : "No defaults were applied.",
    `Curvature follows from the closure relation; integrals were evaluated by adaptive Gauss--Kronrod quadrature to a relative tolerance of $${texNumber(doc.engine.tolerance)}$.`,
    neutrinos?.tex ?? "",
    early
      ? "Recombination and drag redshifts come from the fitting formulas of Hu \\& Sugiyama (1996) and Eisenstein \\& Hu (1998), and $r_\\mathrm{drag}$ from the calibrated formula of Aubourg et al.\\ (2015)."
      : "",
    growth
      ? `${GROWTH_SENTENCE_TEX} Nonlinear structure, lensing and peculiar velocities are not included.`
      : "The model is the homogeneous background only: perturbations, lensing and peculiar velocities are not included.",
    // A SHA-256 is one 64-character word: TeX may break it every 16 digits, so it stays inside the margin.
    `Computed with cosmoledger ${escapeLatex(p.tool_version)} (engine ${escapeLatex(doc.engine.version)}); scenario \\texttt{${escapeLatex(doc.scenario.id)}}, ${escapeLatex(version).replace(/([0-9a-f]{16})(?=[0-9a-f])/g, "$1\\allowbreak{}")}.`,
  ]
    .filter(Boolean)
    .join("\n");
  // How published values were checked is for the authors: after the source line, outside the sentence (and as TeX
  // comments in the LaTeX), never inside the text a paper quotes.
  const notes = transcriptionNotes(doc);
  return {
    plain: `${plain}\n\nSource: ${provenanceLine(p)}\n${notes.map((n) => `\nNote on sources (not part of the methods text): ${n}\n`).join("")}`,
    tex: `% source: scenario ${doc.scenario.id}, ${versionLabel(p)}; page ${p.page}\n${notes.map((n) => `% note on sources: ${oneLine(n)}\n`).join("")}${tex}\n`,
  };
}

/** How the linear growth was computed, for a methods section (src/engine/linearGrowth.ts). */
const GROWTH_SENTENCE =
  "The linear growth factor D(z) and growth rate f = dln D/dln a of cold dark matter plus baryons were obtained by integrating the linear growth equation for pressureless matter in this background from a = 1e-6, starting on the growing mode of a radiation-matter universe (Meszaros 1974); the growth is scale-independent, with dark energy and any massive neutrinos smooth (Omega_cb in the source term), and sigma8(z) = sigma8 D(z).";
const GROWTH_SENTENCE_TEX =
  "The linear growth factor $D(z)$ and growth rate $f = \\mathrm{d}\\ln D/\\mathrm{d}\\ln a$ of cold dark matter plus baryons were obtained by integrating the linear growth equation for pressureless matter in this background from $a = 10^{-6}$, starting on the growing mode of a radiation-matter universe (M\\'esz\\'aros 1974); the growth is scale-independent, with dark energy and any massive neutrinos smooth ($\\Omega_\\mathrm{cb}$ in the source term), and $\\sigma_8(z) = \\sigma_8 D(z)$.";
