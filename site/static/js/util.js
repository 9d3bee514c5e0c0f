// Small DOM and data helpers shared by the page's modules.
// Text from a job (names typed by a user) is always inserted with textContent.

export function readJSON(id) {
  return JSON.parse(document.getElementById(id).textContent);
}

// An SVG element with its attributes and, optionally, its text (the plots and the route sketch draw with it).
export function svgEl(tag, attrs = {}, text) {
  const node = document.createElementNS("http://www.w3.org/2000/svg", tag);
  for (const [k, v] of Object.entries(attrs)) node.setAttribute(k, String(v));
  if (text !== undefined) node.textContent = text;
  return node;
}

export function el(tag, attrs = {}, ...children) {
  const node = document.createElement(tag);
  for (const [key, value] of Object.entries(attrs)) {
    if (value === undefined || value === null || value === false) continue;
    node.setAttribute(key, value === true ? "" : String(value));
  }
  for (const child of children) {
    if (child === undefined || child === null) continue;
    node.append(child instanceof Node ? child : String(child));
  }
  return node;
}

export function clone(value) {
  return value === undefined ? undefined : JSON.parse(JSON.stringify(value));
}

// "lines[0].parts[1].bore_mm" -> ["lines", 0, "parts", 1, "bore_mm"]
export function parsePath(path) {
  const out = [];
  for (const piece of path.split(".")) {
    if (!piece) continue;
    const m = piece.match(/^([^[\]]*)((?:\[\d+\])*)$/);
    if (!m) { out.push(piece); continue; }
    if (m[1]) out.push(m[1]);
    for (const idx of m[2].matchAll(/\[(\d+)\]/g)) out.push(Number(idx[1]));
  }
  return out;
}

export function getPath(obj, path) {
  let cur = obj;
  for (const seg of parsePath(path)) {
    if (cur === null || typeof cur !== "object") return undefined;
    cur = cur[seg];
  }
  return cur;
}

export function setPath(obj, path, value) {
  const segs = parsePath(path);
  let cur = obj;
  for (let i = 0; i < segs.length - 1; i++) {
    const seg = segs[i];
    if (cur[seg] === null || typeof cur[seg] !== "object") cur[seg] = typeof segs[i + 1] === "number" ? [] : {};
    cur = cur[seg];
  }
  cur[segs[segs.length - 1]] = value;
}

export function deletePath(obj, path) {
  const segs = parsePath(path);
  let cur = obj;
  for (let i = 0; i < segs.length - 1; i++) {
    if (cur === null || typeof cur !== "object") return;
    cur = cur[segs[i]];
  }
  if (cur && typeof cur === "object") delete cur[segs[segs.length - 1]];
}

export const VERDICT_WORDS = { ok: "OK", caution: "CAUTION", fail: "FAIL" };
export const VERDICT_MARKS = { ok: "✓", caution: "!", fail: "✗" };
const ORDER = { ok: 0, caution: 1, fail: 2 };

export function badge(verdict, extraText) {
  const v = VERDICT_WORDS[verdict] ? verdict : "caution";
  return el("span", { class: `badge badge-${v}`, "data-verdict": v },
    el("span", { class: "badge-mark", "aria-hidden": "true" }, VERDICT_MARKS[v]), ` ${VERDICT_WORDS[v]}`,
    extraText ? ` ${extraText}` : undefined);
}
