// Boots the shipped Pyodide under Node.js with the engine loaded and writes its memory snapshot.
//
//   node make_snapshot.mjs INDEX_DIR OUT_GZ WARMUP_PY BOOT_PY ENGINE_BUILD ARCHIVE...
//
// INDEX_DIR holds pyodide.mjs and its files. Each ARCHIVE (the wheels, then the bytecode zip) is
// unpacked into site-packages and BOOT_PY written there as linesmith_boot.py, exactly as the
// page's worker does on a plain boot. WARMUP_PY (snapshot_warmup.py) is then run and its
// main(ENGINE_BUILD) called: it imports everything the engine can need and runs every API
// operation once. The snapshot (pyodide.makeMemorySnapshot) is gzip-compressed into OUT_GZ and
// OUT_GZ.json receives {pyodide, bytes_raw, warmup}. Run by sitebuild/snapshot.py; any failure
// is a non-zero exit. Checked with Pyodide 314.0.7 (the snapshot API is experimental).
import fs from "node:fs";
import path from "node:path";
import zlib from "node:zlib";
import { pathToFileURL } from "node:url";

const [indexDir, outGz, warmup, boot, engineBuild, ...archives] = process.argv.slice(2);
const { loadPyodide } = await import(pathToFileURL(path.join(indexDir, "pyodide.mjs")).href);
const py = await loadPyodide({
  indexURL: indexDir + path.sep, _makeSnapshot: true, stdout: () => {}, stderr: (t) => console.error(t),
});
// Pyodide 314.0.7 restores a snapshot into the module's initial memory and cannot grow it first
// (loadPyodide ignores INITIAL_MEMORY): a snapshot of a runtime whose memory grew cannot be restored.
const initialMemory = py._module.HEAP8.length;
const sitePackages = py.pyimport("site").getsitepackages()[0];
const bytesOf = (file) => {
  const b = fs.readFileSync(file); // a Buffer: unpackArchive wants a plain Uint8Array
  return new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
};
// Freed heap blocks still hold stale bytes, which compress badly. Take every free block the
// allocator has without growing the memory, fill it with zeros and give it back: the same
// runtime, a smaller download.
function zeroFreeMemory(module) {
  const size = module.HEAP8.length;
  const sbrk = () => module.HEAPU32[module._emscripten_get_sbrk_ptr() >>> 2];
  const top = sbrk(); // past it the memory was never handed out: already zeros
  const taken = [];
  for (const block of [1 << 20, 1 << 16, 1 << 12, 1 << 8]) {
    // A block from past the top moves the top up; stop well before the memory would have to grow.
    while (sbrk() + 2 * block < size) {
      const p = module._malloc(block);
      if (!p) break;
      taken.push(p);
      if (p + block > top) break; // free blocks of this size are used up
      module.HEAPU8.fill(0, p, p + block);
    }
  }
  for (const p of taken) module._free(p);
  if (module.HEAP8.length !== size) throw new Error("zeroing the free memory grew it");
  return taken.length;
}
for (const archive of archives) {
  py.unpackArchive(bytesOf(archive), archive.endsWith(".whl") ? "wheel" : "zip", { extractDir: sitePackages });
}
py.FS.writeFile(path.posix.join(sitePackages, "linesmith_boot.py"), fs.readFileSync(boot, "utf8"));
py.pyimport("importlib").invalidate_caches();
py.runPython(fs.readFileSync(warmup, "utf8"));
const done = py.globals.get("main")(engineBuild).toJs({ dict_converter: Object.fromEntries });
if (py._module.HEAP8.length !== initialMemory) {
  throw new Error(`the warm-up grew the memory from ${initialMemory} to ${py._module.HEAP8.length} bytes; ` +
                  "a restore could not hold it: make the warm-up lighter");
}
zeroFreeMemory(py._module);
const raw = py.makeMemorySnapshot();
fs.writeFileSync(outGz, zlib.gzipSync(raw, { level: 9 }));
fs.writeFileSync(`${outGz}.json`, JSON.stringify({ pyodide: py.version, bytes_raw: raw.length, warmup: done }));
