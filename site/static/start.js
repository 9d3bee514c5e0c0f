// Starts the engine worker as early as the page allows. This is a classic script in <head>: it runs
// before the browser parses the page's body (the form and its embedded model), so Pyodide boots in
// its own thread while the page is still arriving. app.js adopts the worker and the messages it sent
// meanwhile, in order. Nothing here touches the page's content.
"use strict";
(function startEngineWorker() {
  const early = { worker: null, messages: [], error: null, started: 0 };
  self.linesmithEarly = early;
  try {
    const config = JSON.parse(document.getElementById("linesmith-config").textContent);
    const worker = new Worker("./worker.js", { type: "module" });
    worker.onmessage = (event) => early.messages.push(event);
    worker.onerror = (event) => { event.preventDefault(); early.error = event.message || "it could not be loaded"; };
    worker.postMessage(JSON.stringify({ type: "init", ...config }));
    early.worker = worker;
    early.started = performance.now();
    performance.mark("linesmith-worker-created"); // for the benchmark's timeline
  } catch (error) {
    early.error = error.message;
  }
})();
