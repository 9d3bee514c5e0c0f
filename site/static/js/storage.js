// Saved jobs: autosave to localStorage, save to a .json file, open from a file.
export const STORE_KEY = "linesmith.job.v1";
export const UNITS_KEY = "linesmith.units";

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

// A job file's bytes for the engine, in base64: the engine reads them as the command line does
// (calc.edges.jobfile: size, UTF-8 with or without a byte-order mark, JSON, a job object), so the
// page accepts and refuses exactly what `python -m calc evaluate FILE` does, in the same words.
// Like the command line, only the first maxBytes + 1 bytes are read. Returns {base64} or {error}.
export async function readJobFile(file, maxBytes) {
  let bytes;
  try { bytes = new Uint8Array(await file.slice(0, maxBytes + 1).arrayBuffer()); } catch (e) {
    return { error: `${file.name} could not be read (${e.message}).` };
  }
  let binary = "";
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return { base64: btoa(binary) };
}
