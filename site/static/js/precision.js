// Shop precision: how each quantity is rounded on the build sheet. One declared table, read by the
// sheet and the cutting cards; the README's table states the same rows.
// step: the rounding step in the shown unit; fraction: round to 1/N in and write it as a fraction;
// mode: "nearest", "up" (never shorter than the engine's figure: cut lengths) or "down".
import { toShow, unitLabel, getSystem } from "./units.js";

export const SHOP_PRECISION = {
  cut_length: { label: "Cut and assembly lengths", kind: "length_mm", metric: { step: 1 }, us: { fraction: 16 }, mode: "up" },
  route_length: { label: "Route lengths, bend radii, slack, cut-off allowances", kind: "length_mm", metric: { step: 1 }, us: { fraction: 16 }, mode: "nearest" },
  tube_size: { label: "Tube outside diameters and walls", kind: "length_mm", metric: { step: 0.01 }, us: { step: 0.001 }, mode: "nearest" },
  bore: { label: "Bores", kind: "length_mm", metric: { step: 0.1 }, us: { step: 0.001 }, mode: "nearest" },
  order_length: { label: "Hose and tube to order", kind: "length_m", metric: { step: 0.01 }, us: { step: 0.1 }, mode: "up" },
  pressure: { label: "Pressures (must hold, drops)", kind: "pressure_bar", metric: { step: 0.1 }, us: { step: 1 }, mode: "nearest" },
  rating: { label: "Ratings (working, burst, proof test)", kind: "pressure_bar", metric: { step: 1 }, us: { step: 5 }, mode: "nearest" },
  angle: { label: "Angles and clocking", kind: "angle_deg", metric: { step: 1 }, us: { step: 1 }, mode: "nearest" },
  flow: { label: "Flows (pump, flow table, gear's need)", kind: "flow_lpm", metric: { step: 0.1 }, us: { step: 0.01 }, mode: "nearest" },
  speed: { label: "Pump and engine speeds", kind: "speed_rpm", metric: { step: 10 }, us: { step: 10 }, mode: "nearest" },
  pulley: { label: "Pulley diameters", kind: "length_mm", metric: { step: 1 }, us: { fraction: 16 }, mode: "nearest" },
};

const ROUND = { nearest: Math.round, up: Math.ceil, down: Math.floor };

function decimalsOf(step) {
  const s = String(step);
  return s.includes(".") ? s.split(".")[1].length : 0;
}

function fraction(units, n) {
  // units: a whole count of 1/n in; "63 5/8"
  if (units < 0) return `-${fraction(-units, n)}`;
  const whole = Math.floor(units / n);
  let num = units - whole * n, den = n;
  while (num && num % 2 === 0 && den % 2 === 0) { num /= 2; den /= 2; }
  return num ? (whole ? `${whole} ${num}/${den}` : `${num}/${den}`) : `${whole}`;
}

// The value (engine units) as the shop reads it: "1615 mm", "63 5/8 in", "3000 psi"; "–" when absent.
export function shop(value, quantity, withUnit = true) {
  const p = SHOP_PRECISION[quantity];
  if (!p) throw new Error(`no shop precision for ${quantity}`);
  if (typeof value !== "number" || !Number.isFinite(value)) return "–";
  const sys = getSystem();
  const rule = p[sys === "us" ? "us" : "metric"];
  const shown = toShow(value, p.kind);
  const round = ROUND[p.mode];
  const eps = 1e-9;  // a figure already on a step stays on it
  let text;
  if (rule.fraction) {
    const n = round(shown * rule.fraction + (p.mode === "up" ? -eps : p.mode === "down" ? eps : 0));
    text = fraction(n, rule.fraction);
  } else {
    const k = round(shown / rule.step + (p.mode === "up" ? -eps : p.mode === "down" ? eps : 0));
    text = (k * rule.step).toFixed(decimalsOf(rule.step));
  }
  if (!withUnit) return text;
  const u = unitLabel(p.kind);
  return u === "°" ? `${text}°` : `${text} ${u}`;
}
