// Boots the shipped Pyodide under Node.js and compiles the engine's bytecode in it.
//
//   node compile_in_pyodide.mjs INDEX_DIR OUT_ZIP CODE_PY BOOT_PY IMPORTS_JSON WHEEL...
//
// INDEX_DIR holds pyodide.mjs and its files; the wheels are unpacked into site-packages
// and BOOT_PY is written there as linesmith_boot.py, as the page's worker does. CODE_PY
// (compile_in_pyodide.py) is then run and its main(IMPORTS) called with the JSON list
// IMPORTS_JSON of modules to import; the zip it returns is written to OUT_ZIP.
// Run by sitebuild/bytecode.py; any failure is a non-zero exit.
import fs from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";

const [indexDir, outZip, code, boot, importsJson, ...wheels] = process.argv.slice(2);
const { loadPyodide } = await import(pathToFileURL(path.join(indexDir, "pyodide.mjs")).href);
const py = await loadPyodide({ indexURL: indexDir + path.sep, stdout: () => {}, stderr: () => {} });
const sitePackages = py.pyimport("site").getsitepackages()[0];
for (const wheel of wheels) {
  py.unpackArchive(new Uint8Array(fs.readFileSync(wheel)), "wheel", { extractDir: sitePackages });
}
py.FS.writeFile(path.posix.join(sitePackages, "linesmith_boot.py"), fs.readFileSync(boot, "utf8"));
py.runPython(fs.readFileSync(code, "utf8"));
const result = py.globals.get("main")(py.toPy(JSON.parse(importsJson)));
fs.writeFileSync(outZip, result.toJs());
