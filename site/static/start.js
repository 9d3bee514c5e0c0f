// Starts the engine worker as early as the page allows. This is a classic script in <head>: it runs
// before the browser parses the page's body (the form and its embedded model), so Pyodide boots in
// its own thread while the page is still arriving. app.js adopts the worker and the messages it sent
// meanwhile, in order. Nothing here touches the page's content.
//
// With an engine snapshot in the build (config.snapshot) the worker first tries to restore it. If it
// is not ready within config.snapshot.limit_ms (a restore that hangs), this script ends that worker
// and starts one that boots plainly; app.js never sees the swap: it holds `engine`, which stands for
// whichever worker is current. On any snapshot failure (the worker's own "fallback" or the time
// limit) the service worker is asked to drop the stored snapshot (sw.js, "drop-snapshot").
"use strict";
(function startEngineWorker() {
  const early = { worker: null, messages: [], error: null, started: 0, snapshot: null };
  self.linesmithEarly = early;

  function dropSnapshot(reason) {
    early.snapshot = { used: false, fallback: reason };
    if (!("serviceWorker" in navigator)) return;
    // On a first visit this waits until offline.js has registered sw.js and it is active.
    navigator.serviceWorker.ready
      .then((registration) => registration.active && registration.active.postMessage({ type: "drop-snapshot", reason }))
      .catch(() => {});
  }

  try {
    const config = JSON.parse(document.getElementById("linesmith-config").textContent);
    let current = null;
    let starting = true; // until the current worker says "ready" or "failed"
    let timer = 0;
    const engine = {
      onmessage: null,
      onerror: null,
      postMessage: (data) => current.postMessage(data),
      terminate: () => current.terminate(),
    };
    const deliver = (event) => (engine.onmessage ? engine.onmessage(event) : early.messages.push(event));

    function spawn(init) {
      const worker = new Worker("./worker.js", { type: "module" });
      worker.onmessage = (event) => {
        if (worker !== current) return; // an ended worker's last words
        if (starting) {
          const type = JSON.parse(event.data).type;
          if (type === "fallback") dropSnapshot(JSON.parse(event.data).reason);
          if (type === "ready" || type === "failed" || type === "fallback") clearTimeout(timer);
          if (type === "ready" || type === "failed") starting = false;
          if (type === "ready" && init.snapshot && !early.snapshot) early.snapshot = { used: true, fallback: null };
        }
        deliver(event);
      };
      worker.onerror = (event) => {
        event.preventDefault();
        if (worker !== current) return;
        if (engine.onerror) engine.onerror(event);
        else early.error = event.message || "it could not be loaded";
      };
      worker.postMessage(JSON.stringify({ type: "init", ...init }));
      current = worker;
    }

    spawn(config);
    if (config.snapshot) {
      timer = setTimeout(() => {
        const reason = `the snapshot start took longer than ${config.snapshot.limit_ms / 1000} s`;
        current.terminate();
        dropSnapshot(reason);
        spawn({ ...config, snapshot: null, fallback: reason });
      }, config.snapshot.limit_ms);
    }
    early.worker = engine;
    early.started = performance.now();
    performance.mark("linesmith-worker-created"); // for the benchmark's timeline
  } catch (error) {
    early.error = error.message;
  }
})();
