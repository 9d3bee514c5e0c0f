// The engine's result declaration (calc.model.result, embedded at build time): the label and
// unit of every result key, so the page's tables show what the engine declares and convert each
// number by its declared unit. Paths use "[]" for list items: "conditions[].lines[].flow_lpm".
import { readJSON } from "./util.js";
import { fmt, unitLabel } from "./units.js";

const ROWS = new Map(readJSON("linesmith-result-model").map((r) => [r.path, r]));

export function declared(path) {
  const row = ROWS.get(path);
  if (!row) throw new Error(`the result declaration has no ${path}`);
  return row;
}

// "Velocity (m/s)": the declared label with the display unit.
export function heading(path) {
  const row = declared(path);
  const u = row.kind === "number" ? unitLabel(row.unit) : "";
  return u ? `${row.label} (${u})` : row.label;
}

// A value of the result in the display system, by its declared unit.
export function shown(value, path, decimals) {
  return fmt(value, declared(path).unit, decimals);
}

// The dash size the engine gives a part of the user's list: "-6", or "≈ -6" when the size is
// between dash sizes; "" when the result has no such part.
export function partDash(result, lineIndex, jobPart) {
  const line = result && (result.lines || [])[lineIndex];
  const part = line && (line.parts || []).find((p) => p.job_part === jobPart);
  if (!part || typeof part.dash !== "number") return "";
  return `${part.dash_exact ? "" : "≈ "}-${part.dash}`;
}

// The engine's part record (size, dash) for a part of the user's list, or null.
export function resultPart(result, lineIndex, jobPart) {
  const line = result && (result.lines || [])[lineIndex];
  return (line && (line.parts || []).find((p) => p.job_part === jobPart)) || null;
}

const CHOICE_WORDS = new Map(); // field key -> {choice: words}, from the job model

// The unit kind of a job field, by its key (keys carry their unit: one unit per key in the job model).
const JOB_UNITS = (() => {
  const out = new Map();
  const walk = (node) => {
    if (!node || typeof node !== "object") return;
    if (typeof node.key === "string" && "unit" in node && !out.has(node.key)) out.set(node.key, node.unit);
    if (typeof node.key === "string" && node.choice_words) CHOICE_WORDS.set(node.key, node.choice_words);
    for (const f of node.fields || []) walk(f);
    if (node.item) walk(node.item);
    for (const v of Object.values(node.variants || {})) walk(v);
  };
  walk(readJSON("linesmith-model").job);
  return out;
})();

export function jobFieldUnit(path) {
  return JOB_UNITS.get(path.split(".").pop().replace(/\[\d+\]$/, "")) || null;
}

// A choice in words, as the job model gives them ("flare-37" is "flare cone (37 deg)").
export function choiceWords(key, value) {
  const words = CHOICE_WORDS.get(key);
  return (words && words[value]) || String(value);
}

// An edit's value in words, in the display units: "1.042 m", "-8", "37 deg flare (JIC)".
export function editValue(path, value) {
  const unit = jobFieldUnit(path);
  if (typeof value === "number" && unit) return `${Number(fmt(value, unit, 6)).toString()} ${unitLabel(unit)}`.trim();
  if (path.endsWith("dash") && typeof value === "number") return `-${value}`;
  return typeof value === "string" ? choiceWords(path.split(".").pop().replace(/\[\d+\]$/, ""), value) : String(value);
}
