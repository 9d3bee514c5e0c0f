// A table field of the job model (kind "table", such as the pump's flow table): rows of numbers, one
// input per cell, columns declared by the model (label, unit, limits on the <th> of each column).
// Nothing here computes an engine quantity: cells are read in the shown units and converted to the
// engine's, as every other number field is. A row being typed (a cell empty or not a number) stays a
// draft in the form, with its reason in words; the job keeps its last table whose cells are all good.
import { el } from "./util.js";
import { fromShow, inputText, unitLabel } from "./units.js";
import { outOfRange, readNumber } from "./numbers.js";

const drafts = new Map(); // field path -> rows of typed text, while some cell is not a valid number

export function clearDrafts(prefix = "") {
  for (const key of [...drafts.keys()]) if (key.startsWith(prefix)) drafts.delete(key);
}

function columns(holder) {
  return [...holder.querySelectorAll("thead th[data-col]")].map((th) => ({
    label: th.dataset.colLabel, unit: th.dataset.unit, th }));
}

function newRow(cols, path, i) {
  return el("tr", { "data-row": i },
    el("th", { scope: "row" }, String(i + 1)),
    ...cols.map((c, j) => el("td", {}, el("input", { type: "text", inputmode: "decimal", autocomplete: "off",
      "data-cell": `${i},${j}`, "data-path": `${path}[${i}][${j}]`, "aria-label": `${c.label}, row ${i + 1} (${unitLabel(c.unit)})` }))),
    el("td", {}, el("button", { type: "button", class: "remove-row", "aria-label": `Remove row ${i + 1}` }, "Remove")));
}

// Fill the table from the job's value (rows in engine units) or from the draft being typed.
export function fillTable(holder, path, value) {
  holder.dataset.path = path;
  const cols = columns(holder);
  const typed = drafts.get(path);
  const rows = typed || (Array.isArray(value) ? value.map((r) => r.map((v, j) => (typeof v === "number" ? inputText(v, cols[j].unit) : ""))) : []);
  const body = holder.querySelector("tbody");
  // Rows already shown take their new values in place (a value set by the script leaves no change pending
  // on the focused cell); rows beyond go. While rows are swapped, a change the browser fires for a cell it
  // takes away is not an edit (holder.dataset.filling; see form.js).
  holder.dataset.filling = "1";
  try {
    while (body.rows.length > rows.length) body.lastElementChild.remove();
    rows.forEach((row, i) => {
      const tr = body.rows[i] || body.appendChild(newRow(cols, path, i));
      tr.querySelectorAll("input[data-cell]").forEach((input, j) => { input.value = row[j] ?? ""; });
    });
  } finally {
    delete holder.dataset.filling;
  }
  holder.querySelector(".table-empty").hidden = rows.length > 0;
  holder.querySelector(".add-row").disabled = rows.length >= Number(holder.dataset.maxRows);
}

function typedRows(holder) {
  return [...holder.querySelectorAll("tbody tr")].map((tr) => [...tr.querySelectorAll("input[data-cell]")].map((i) => i.value));
}

// The table as typed: {value} (rows in engine units; {empty} for no rows) or {error, cell} in words.
function readRows(holder, rows) {
  const cols = columns(holder);
  const out = [];
  for (const [i, row] of rows.entries()) {
    if (row.every((text) => !text.trim())) {
      return { error: `row ${i + 1} is not complete: type its ${cols.map((c) => c.label.toLowerCase()).join(" and ")} (or remove the row)`, cell: [i, 0] };
    }
    const cells = [];
    for (const [j, text] of row.entries()) {
      const c = cols[j];
      const where = `${c.label} in row ${i + 1}`;
      if (!text.trim()) return { error: `${where} is empty: type it, or remove the row`, cell: [i, j] };
      const read = readNumber(text);
      if (read.error) return { error: `${where}: ${read.error}`, cell: [i, j] };
      const value = fromShow(read.value, c.unit);
      const range = outOfRange(value, c.th, (limit) => `${inputText(limit, c.unit)} ${unitLabel(c.unit)}`.trim());
      if (range) return { error: `${where}: ${text} was not taken: it ${range}`, cell: [i, j] };
      cells.push(value);
    }
    out.push(cells);
  }
  return out.length ? { value: out } : { empty: true };
}

// After a cell's edit or a row added or removed: the rows read, the draft kept while one is not good.
// Returns {value} / {empty} for the job, or {error} (the job keeps its last good table).
export function tableEdit(holder, rows = typedRows(holder)) {
  const path = holder.dataset.path;
  const read = readRows(holder, rows);
  if (read.error) {
    drafts.set(path, rows);
    return { error: `${read.error}; the last complete table is kept`, cell: read.cell };
  }
  drafts.delete(path);
  return read;
}

// Mark the cell a draft's reason is about (none: every mark goes).
export function markCell(holder, cell) {
  for (const input of holder.querySelectorAll("input[data-cell]")) input.removeAttribute("aria-invalid");
  const bad = cell && holder.querySelector(`input[data-cell="${cell[0]},${cell[1]}"]`);
  if (bad) bad.setAttribute("aria-invalid", "true");
}

// A click on "Add a row" or a row's "Remove": the new rows as typed (a new row starts empty).
export function rowsAfterClick(holder, button) {
  const rows = typedRows(holder);
  if (button.classList.contains("add-row")) {
    if (rows.length >= Number(holder.dataset.maxRows)) return null;
    rows.push(rows.length ? rows[0].map(() => "") : columns(holder).map(() => ""));
    return rows;
  }
  if (button.classList.contains("remove-row")) {
    const i = Number(button.closest("tr").dataset.row);
    rows.splice(i, 1);
    return rows;
  }
  return null;
}
