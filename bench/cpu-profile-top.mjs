// Prints the functions with the most self time in a V8 .cpuprofile (`node --cpu-prof`), grouped by function and
// file, and the same grouped by package (node_modules/<name>) or our own file. Only samples from the last SECONDS of
// the profile count when given (the load run, when the server was stopped right after it; start-up left out).
// Usage: node bench/cpu-profile-top.mjs FILE [TOP=25] [SECONDS]
import fs from "node:fs";

const [file, top = "25", lastSeconds] = process.argv.slice(2);
const profile = JSON.parse(fs.readFileSync(file, "utf8"));
const byId = new Map(profile.nodes.map((n) => [n.id, n]));
const from = lastSeconds ? profile.endTime - Number(lastSeconds) * 1e6 : -Infinity; // microseconds
const hits = new Map();
let at = profile.startTime;
let counted = 0;
profile.samples.forEach((id, i) => {
  at += profile.timeDeltas[i];
  if (at < from) return;
  hits.set(id, (hits.get(id) ?? 0) + 1);
  counted++;
});
const dt = (profile.endTime - Math.max(from, profile.startTime)) / 1000 / counted; // ms per sample
let total = 0;
const byFn = new Map();
const byPkg = new Map();
for (const [id, n] of hits) {
  const f = byId.get(id).callFrame;
  const where = f.url
    .replace(/^file:\/\//, "")
    .replace(/^.*node_modules\//, "npm:")
    .replace(/^.*\/dist\//, "dist/");
  const fn = `${f.functionName || "(anonymous)"}  ${where}${f.url ? `:${f.lineNumber + 1}` : ""}`;
  byFn.set(fn, (byFn.get(fn) ?? 0) + n);
  const pkg = where.startsWith("npm:")
    ? where
        .split("/")
        .slice(0, where.startsWith("npm:@") ? 2 : 1)
        .join("/")
    : where || f.functionName;
  byPkg.set(pkg, (byPkg.get(pkg) ?? 0) + n);
  total += n;
}
const show = (title, m) => {
  console.log(`\n${title} (self time, ${(total * dt).toFixed(0)} ms sampled)`);
  for (const [k, n] of [...m].sort((a, b) => b[1] - a[1]).slice(0, Number(top)))
    console.log(`${((100 * n) / total).toFixed(1).padStart(5)}%  ${(n * dt).toFixed(0).padStart(6)} ms  ${k}`);
};
show("By function", byFn);
show("By package or file", byPkg);
