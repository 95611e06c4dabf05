// Runs every shared test vector inside Pyodide under Node.js, with the calc.zip the build ships.
//   node tests/pyodide/run_vectors.mjs PYODIDE_DIR CALC_ZIP VECTORS_JSON
// VECTORS_JSON is [[calculator, inputs], ...]; prints [result, ...] as JSON, one per vector.
import { readFileSync } from "node:fs";
import path from "node:path";

const [pyodideDir, calcZip, vectorsFile] = process.argv.slice(2);
const { loadPyodide } = await import(path.resolve(pyodideDir, "pyodide.mjs"));
const pyodide = await loadPyodide({ indexURL: path.resolve(pyodideDir) + "/" });
const extractDir = "/home/pyodide/fluxbook";
// A Node Buffer is not a typed array Pyodide accepts: copy it into a plain Uint8Array.
pyodide.unpackArchive(new Uint8Array(readFileSync(calcZip)), "zip", { extractDir });
pyodide.runPython(`import sys; sys.path.insert(0, ${JSON.stringify(extractDir)})`);
const runJson = pyodide.pyimport("calc.api").run_json;
const version = pyodide.runPython("import sys; sys.version.split()[0]");
const results = JSON.parse(readFileSync(vectorsFile, "utf8")).map(([calculator, inputs]) =>
  JSON.parse(runJson(calculator, JSON.stringify(inputs))));
process.stdout.write(JSON.stringify({ python: version, results }));
