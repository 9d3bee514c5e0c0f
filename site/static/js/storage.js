// Saved jobs: autosave to localStorage, save to a .json file, open from a file.
export const STORE_KEY = "linesmith.job.v1";
export const UNITS_KEY = "linesmith.units";
export const MAX_FILE_BYTES = 1_000_000;

export function autosave(job) {
  try { localStorage.setItem(STORE_KEY, JSON.stringify(job)); return true; } catch { return false; }
}

export function restore() {
  try {
    const text = localStorage.getItem(STORE_KEY);
    if (!text) return null;
    const job = JSON.parse(text);
    return job && typeof job === "object" && !Array.isArray(job) ? job : null;
  } catch { return null; }
}

export function saveFile(job) {
  const blob = new Blob([JSON.stringify(job, null, 2) + "\n"], { type: "application/json" });
  const a = document.createElement("a");
  const base = (job.name || "linesmith-job").replace(/[^A-Za-z0-9._-]+/g, "-").replace(/^-+|-+$/g, "").slice(0, 60) || "linesmith-job";
  a.href = URL.createObjectURL(blob);
  a.download = `${base}.json`;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(a.href), 1000);
}

// Read and check a job file before the engine sees it. Returns {job} or {error}.
export async function readJobFile(file, version) {
  if (file.size > MAX_FILE_BYTES) {
    return { error: `${file.name} is ${(file.size / 1e6).toFixed(1)} MB; a job file must be under 1 MB.` };
  }
  let text;
  try { text = await file.text(); } catch (e) { return { error: `${file.name} could not be read (${e.message}).` }; }
  // A UTF-8 byte-order mark (written by some editors) is not JSON: drop it first.
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  let job;
  try { job = JSON.parse(text); } catch (e) { return { error: `${file.name} is not valid JSON: ${e.message}.` }; }
  if (!job || typeof job !== "object" || Array.isArray(job)) {
    return { error: `${file.name} does not hold a job: the file must be a JSON object.` };
  }
  if (job.version !== version) {
    return { error: `${file.name} is a job file of version ${JSON.stringify(job.version ?? "(none)")}; this page reads version ${version}.` };
  }
  return { job };
}
