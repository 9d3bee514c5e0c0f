// The one module that uses Pyodide's memory-snapshot API, which Pyodide marks experimental
// (the underscore options of loadPyodide). Checked with Pyodide 314.0.7: loadPyodide({
// _loadSnapshot}) takes the bytes (or a promise of them) that makeMemorySnapshot() gave under
// Node.js (sitebuild/make_snapshot.mjs), refuses a snapshot of another Pyodide build ("build id
// mismatch") and restores the memory image; the in-memory file system is not part of it (the
// standard library zip is mounted again, unpacked wheels are not). It restores into the WebAssembly
// module's initial memory (30 MiB) without growing it, so the build's snapshot must fit that (the
// build checks). On another Pyodide version
// restore() refuses to try, and the worker boots plainly.
import { loadPyodide } from "./pyodide/pyodide.mjs";

export const CHECKED_WITH = "314.0.7";

// The snapshot at url, gunzipped by the browser as it arrives; resolves to one Uint8Array.
// rawBytes (the build's figure) lets it fill one buffer instead of joining chunks.
export async function fetchSnapshot(url, rawBytes = 0) {
  const response = await fetch(url);
  if (!response.ok) throw new Error(`the snapshot answered ${response.status}`);
  const reader = response.body.pipeThrough(new DecompressionStream("gzip")).getReader();
  let out = new Uint8Array(rawBytes);
  let length = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    if (length + value.length > out.length) {
      const bigger = new Uint8Array(Math.max(out.length * 2, length + value.length));
      bigger.set(out.subarray(0, length));
      out = bigger;
    }
    out.set(value, length);
    length += value.length;
  }
  return length === out.length ? out : out.subarray(0, length);
}

// A Pyodide runtime restored from snapshot (a promise of its bytes, from fetchSnapshot), with
// its files at indexURL. The WebAssembly module is fetched and compiled while snapshot arrives.
export async function restore(indexURL, snapshot, version) {
  if (version !== CHECKED_WITH) {
    throw new Error(`this start-up path was checked with Pyodide ${CHECKED_WITH}, not ${version}`);
  }
  return loadPyodide({ indexURL, _loadSnapshot: snapshot });
}
