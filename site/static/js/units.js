// Display units: the engine's unit table (calc/units.py, embedded at build time).
// The job always stays in engine units; only what is shown is converted.
import { readJSON } from "./util.js";

export const UNITS = readJSON("linesmith-units"); // kind -> [metric label, US label, factor, offset]
let system = "metric";

export function getSystem() { return system; }
export function setSystem(value) { system = value === "us" ? "us" : "metric"; }

export function toShow(value, kind, sys = system) {
  if (typeof value !== "number" || !kind || !UNITS[kind] || sys === "metric") return value;
  const [, , factor, offset] = UNITS[kind];
  return value * factor + offset;
}

export function fromShow(value, kind, sys = system) {
  if (!kind || !UNITS[kind] || sys === "metric") return value;
  const [, , factor, offset] = UNITS[kind];
  return (value - offset) / factor;
}

// A temperature difference converts without the offset.
export function diffToShow(value, kind) {
  if (typeof value !== "number" || !kind || !UNITS[kind] || system === "metric") return value;
  return value * UNITS[kind][2];
}

export function unitLabel(kind, sys = system) {
  return kind && UNITS[kind] ? UNITS[kind][sys === "metric" ? 0 : 1] : "";
}

// Decimals shown in results, per unit kind and system.
const DECIMALS = {
  pressure_bar: [2, 1], flow_lpm: [2, 3], speed_m_s: [2, 2], temp_c: [1, 1], temp_diff_c: [2, 2],
  length_mm: [1, 3], length_m: [2, 2], viscosity_cst: [2, 2], power_w: [0, 0], time_s: [0, 0],
  conductance_w_k: [1, 1], density_kg_m3: [1, 2], ratio: [2, 2], speed_rpm: [0, 0], volume_l: [2, 3],
};

export function decimalsFor(kind, override) {
  if (override !== undefined) return Array.isArray(override) ? override[system === "metric" ? 0 : 1] : override;
  const d = DECIMALS[kind];
  return d ? d[system === "metric" ? 0 : 1] : 2;
}

// Shown text of an engine value: converted, rounded; "–" when absent.
export function fmt(value, kind, decimals) {
  if (typeof value !== "number" || !Number.isFinite(value)) return "–";
  return toShow(value, kind).toFixed(decimalsFor(kind, decimals));
}

export function fmtDiff(value, kind, decimals) {
  if (typeof value !== "number" || !Number.isFinite(value)) return "–";
  return diffToShow(value, kind).toFixed(decimalsFor(kind, decimals));
}

// Text for an input: the converted value to 6 significant digits (display only).
export function inputText(value, kind) {
  if (typeof value !== "number" || !Number.isFinite(value)) return "";
  // Metric values show as stored (what the user typed); a US conversion is rounded to the
  // decimals its kind shows in US units (15 mm is 0.591 in, not 0.590551 in).
  const shown = toShow(value, kind);
  if (shown === value || !DECIMALS[kind]) return String(Number(shown.toPrecision(shown === value ? 6 : 4)));
  return String(Number(shown.toFixed(DECIMALS[kind][1])));
}
