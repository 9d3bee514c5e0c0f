// Linesmith page: starts the engine worker, runs the demo job, shows the result.
// Text from a job (names typed by a user) is always inserted with textContent.

const body = document.body;
const statusText = document.getElementById("status-text");
const statusBar = document.getElementById("status-progress");
const resultsSection = document.getElementById("results");
const resultsBody = document.getElementById("results-body");

function readJSON(id) {
  return JSON.parse(document.getElementById(id).textContent);
}

function el(tag, attrs = {}, text) {
  const node = document.createElement(tag);
  for (const [key, value] of Object.entries(attrs)) node.setAttribute(key, value);
  if (text !== undefined) node.textContent = text;
  return node;
}

function setStatus(text, percent) {
  statusText.textContent = text;
  if (percent !== undefined) {
    statusBar.value = percent;
    statusBar.textContent = `${percent} %`;
  }
}

function fail(message, details = []) {
  body.dataset.engine = "failed";
  statusBar.hidden = true;
  statusText.textContent = message;
  statusText.className = "error";
  if (details.length) {
    const list = el("ul", { class: "error-list" });
    for (const line of details) list.append(el("li", {}, line));
    statusText.after(list);
  }
}

// Shown figures: decimals per quantity. The browser test reads these back and
// uses half a unit of the last digit as its tolerance.
const DECIMALS = {
  pump_flow_lpm: 2,
  pump_outlet_bar: 2,
  viscosity_cst: 2,
  velocity_max_m_s: 2,
  reynolds_min: 0,
  pressure_drop_bar: 3,
};

function fmt(value, field) {
  if (typeof value !== "number" || !Number.isFinite(value)) return "–";
  return value.toFixed(DECIMALS[field]);
}

function numberCell(tag, value, field) {
  return el(tag, { class: "num", "data-field": field }, fmt(value, field));
}

function renderResult(result) {
  resultsBody.replaceChildren();
  (result.conditions || []).forEach((condition, ci) => {
    const block = el("article", { class: "condition", "data-condition": String(ci) });
    block.append(el("h3", { class: "condition-name" }, condition.name));

    const summary = el("dl", { class: "condition-summary" });
    for (const [label, field, unit] of [
      ["Pump flow", "pump_flow_lpm", "L/min"],
      ["Pump outlet pressure", "pump_outlet_bar", "bar"],
      ["Fluid viscosity", "viscosity_cst", "cSt"],
    ]) {
      const dd = el("dd");
      dd.append(numberCell("span", condition[field], field), ` ${unit}`);
      summary.append(el("dt", {}, label), dd);
    }
    block.append(summary);

    const table = el("table", { class: "lines" });
    const head = el("tr");
    for (const text of ["Line", "Role", "Velocity, max (m/s)", "Reynolds number, min", "Pressure drop (bar)"]) {
      head.append(el("th", { scope: "col" }, text));
    }
    table.append(el("thead"), el("tbody"));
    table.tHead.append(head);
    (condition.lines || []).forEach((line, li) => {
      const row = el("tr", { "data-line": String(li) });
      row.append(el("th", { scope: "row", class: "line-name" }, line.name), el("td", {}, line.role));
      row.append(
        numberCell("td", line.velocity_max_m_s, "velocity_max_m_s"),
        numberCell("td", line.reynolds_min, "reynolds_min"),
        numberCell("td", line.pressure_drop_bar, "pressure_drop_bar"),
      );
      table.tBodies[0].append(row);
    });
    block.append(table);
    resultsBody.append(block);
  });
  resultsSection.hidden = false;
}

function startEngine() {
  const config = readJSON("linesmith-config");
  const demo = readJSON("linesmith-demo");
  document.getElementById("job-name").textContent = (demo && demo.name) || "(unnamed)";

  let worker;
  try {
    worker = new Worker(new URL("./worker.js", import.meta.url), { type: "module" });
  } catch (error) {
    fail(`This browser cannot start the engine worker (${error.message}).`);
    return;
  }
  const started = performance.now();
  let nextId = 1;
  const pending = new Map();

  function call(request) {
    const id = nextId++;
    return new Promise((resolve) => {
      pending.set(id, resolve);
      worker.postMessage(JSON.stringify({ type: "call", id, request: JSON.stringify(request) }));
    });
  }

  worker.onerror = (event) => {
    event.preventDefault();
    fail(`The engine worker stopped: ${event.message || "it could not be loaded"}.`);
  };

  worker.onmessage = async (event) => {
    const message = JSON.parse(event.data);
    if (message.type === "progress") {
      setStatus(message.text, message.percent);
    } else if (message.type === "failed") {
      fail(message.message);
    } else if (message.type === "reply") {
      const resolve = pending.get(message.id);
      pending.delete(message.id);
      if (resolve) resolve(JSON.parse(message.response));
    } else if (message.type === "ready") {
      body.dataset.workerTimings = JSON.stringify(message.timings_ms);
      setStatus("Calculating the demo job…", 95);
      const reply = await call({ op: "evaluate", job: demo });
      if (!reply.ok) {
        fail("The engine could not evaluate the demo job:",
          (reply.errors || []).map((e) => (e.path ? `${e.path}: ${e.message}` : e.message)));
        return;
      }
      renderResult(reply.result);
      const seconds = ((performance.now() - started) / 1000).toFixed(1);
      setStatus(`Engine ready (started in ${seconds} s).`, 100);
      statusBar.hidden = true;
      body.dataset.bootMs = String(Math.round(performance.now() - started));
      body.dataset.engine = "ready";
    }
  };

  worker.postMessage(JSON.stringify({ type: "init", ...config }));
}

try {
  startEngine();
} catch (error) {
  fail(`The page could not start: ${error.message}`);
}
