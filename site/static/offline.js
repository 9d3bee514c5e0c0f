// Linesmith offline support: registers the service worker (sw.js) once the
// engine is ready, so the first visit's downloads are not slowed down and the
// precache mostly revalidates files the browser already holds.
//
// State for tests and the page, on <body data-offline="...">:
//   "unsupported"     no service workers here (e.g. not a secure context)
//   "installing"      this build is being stored for offline use
//   "ready"           this build is stored; the page works with no network
//   "update-waiting"  a newer build is stored and takes over once every tab of
//                     this one is closed, or at once with linesmithOffline.applyUpdate()
//   "failed"          storing failed (the page itself still works online)
// window.linesmithOffline = { state, applyUpdate() } for the page's own UI.

const body = document.body;
const api = { state: "", applyUpdate };
window.linesmithOffline = api;
let registration = null;

function mark(state) {
  api.state = state;
  body.dataset.offline = state;
}

function refresh() {
  if (!registration) return;
  if (navigator.serviceWorker.controller) mark(registration.waiting ? "update-waiting" : "ready");
  else if (registration.installing || registration.waiting) mark("installing");
}

function watch(worker) {
  if (!worker) return;
  worker.addEventListener("statechange", () => {
    if (worker.state === "redundant" && !registration.active) mark("failed");
    else refresh();
  });
}

function applyUpdate() {
  if (!registration || !registration.waiting) return false;
  navigator.serviceWorker.addEventListener("controllerchange", () => location.reload(), { once: true });
  registration.waiting.postMessage({ type: "skip-waiting" });
  return true;
}

async function register() {
  if (!navigator.serviceWorker.controller) mark("installing");
  try {
    registration = await navigator.serviceWorker.register("./sw.js", { scope: "./", updateViaCache: "none" });
  } catch (error) {
    // Offline, the update check fails; the stored build still serves the page.
    mark(navigator.serviceWorker.controller ? "ready" : "failed");
    return;
  }
  watch(registration.installing);
  watch(registration.waiting);
  registration.addEventListener("updatefound", () => { watch(registration.installing); refresh(); });
  navigator.serviceWorker.addEventListener("controllerchange", refresh);
  refresh();
}

function whenEngineReady(callback) {
  if (body.dataset.engine === "ready") return callback();
  const observer = new MutationObserver(() => {
    if (body.dataset.engine === "ready") {
      observer.disconnect();
      callback();
    }
  });
  observer.observe(body, { attributes: true, attributeFilter: ["data-engine"] });
}

if ("serviceWorker" in navigator && window.isSecureContext) {
  whenEngineReady(register);
} else {
  mark("unsupported");
}
