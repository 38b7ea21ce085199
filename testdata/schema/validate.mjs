// Validates goals files against cairn's generated JSON Schema with ajv, a
// general-purpose validator, reading YAML with the yaml package (both pinned
// in package-lock.json). Run by .ci/run:
//
//   node validate.mjs good FILE...   each file must validate
//   node validate.mjs bad FILE...    each file must be YAML that the schema rejects
//
// The schema is ../../schema/goals.schema.json, or $SCHEMA.
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import Ajv2020 from "ajv/dist/2020.js";
import YAML from "yaml";

const [mode, ...files] = process.argv.slice(2);
if (!["good", "bad"].includes(mode) || files.length === 0) {
  console.error("usage: node validate.mjs good|bad FILE...");
  process.exit(2);
}
const schemaPath = process.env.SCHEMA ?? fileURLToPath(new URL("../../schema/goals.schema.json", import.meta.url));
const ajv = new Ajv2020({ allErrors: true, strict: true, allowUnionTypes: true });
const validate = ajv.compile(JSON.parse(readFileSync(schemaPath, "utf8")));

let failed = 0;
for (const file of files) {
  const text = readFileSync(file, "utf8");
  let doc;
  try {
    doc = file.endsWith(".json") ? JSON.parse(text) : YAML.parse(text);
  } catch (e) {
    console.log(`FAIL ${file}: not readable: ${e.message.split("\n")[0]}`);
    failed++;
    continue;
  }
  const ok = validate(doc);
  const why = ok ? "" : validate.errors.map((e) => `${e.instancePath || "/"} ${e.keyword === "pattern" ? "is not written in its form" : e.message}`).slice(0, 3).join("; ");
  if (ok === (mode === "good")) {
    console.log(`ok   ${file}${why ? ": rejected: " + why : ""}`);
  } else {
    console.log(`FAIL ${file}: ${ok ? "the schema accepts it" : why}`);
    failed++;
  }
}
if (failed > 0) {
  console.log(`${failed} of ${files.length} files failed`);
  process.exit(1);
}
