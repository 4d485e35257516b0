#!/usr/bin/env node
// Project lint: the architectural rules a type checker cannot see.
//  1. Imports run one way: ui -> render -> core, cli -> render -> core.
//  2. src/core touches no DOM, svg.js, solid-js, node: module or process.
//  3. Reference tests name their sources.
//  4. No stray console.log in src/core or src/render.
import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative, dirname, resolve } from "node:path";

const root = resolve(dirname(new URL(import.meta.url).pathname), "..");
const problems = [];

function walk(dir) {
  let out = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out = out.concat(walk(p));
    else if (/\.(ts|tsx|mjs)$/.test(name)) out.push(p);
  }
  return out;
}

const LAYER_OF = (file) => relative(join(root, "src"), file).split("/")[0];
const MAY_IMPORT = { core: ["core"], render: ["render", "core"], ui: ["ui", "render", "core"], cli: ["cli", "render", "core"] };
const CORE_FORBIDDEN = [/^node:/, /^@svgdotjs\//, /^svgdom$/, /^solid-js/, /^fs$/, /^path$/, /^child_process$/];
const IMPORT_RE = /(?:^|\n)\s*(?:import|export)\s[^;]*?from\s*["']([^"']+)["']|import\(\s*["']([^"']+)["']\s*\)/g;

for (const file of walk(join(root, "src"))) {
  const text = readFileSync(file, "utf8");
  const layer = LAYER_OF(file);
  const rel = relative(root, file);
  for (const m of text.matchAll(IMPORT_RE)) {
    const spec = m[1] ?? m[2];
    if (spec.startsWith(".")) {
      const target = resolve(dirname(file), spec);
      if (!target.startsWith(join(root, "src"))) continue;
      const targetLayer = LAYER_OF(target);
      if (!MAY_IMPORT[layer]?.includes(targetLayer)) problems.push(`${rel}: ${layer} may not import ${targetLayer} (${spec})`);
    } else if (layer === "core" && CORE_FORBIDDEN.some((re) => re.test(spec))) {
      problems.push(`${rel}: src/core must stay pure; it imports ${spec}`);
    }
  }
  const code = text.replace(/\/\*[\s\S]*?\*\//g, "").replace(/^\s*\/\/.*$/gm, "");
  if (layer === "core") {
    if (/\b(document|window|process)\.\w/.test(code)) problems.push(`${rel}: src/core touches the DOM or the process`);
  }
  if ((layer === "core" || layer === "render") && /console\.log\(/.test(code)) problems.push(`${rel}: console.log in ${layer}`);
}

for (const file of walk(join(root, "tests", "reference"))) {
  const text = readFileSync(file, "utf8");
  if (!/\b(source|Source|common practice|recalled from memory|computed)\b/.test(text)) {
    problems.push(`${relative(root, file)}: a reference test must name its source`);
  }
}

if (problems.length > 0) {
  console.error(problems.join("\n"));
  console.error(`\nlint: ${problems.length} problem(s)`);
  process.exit(1);
}
console.log("lint: ok");
