export {};

// `npm run bench`: runs every benchmark suite in this folder and prints, as its last line, one JSON
// object with all figures. Each suite exports `run(): Promise<Record<string, unknown>>`.
const suites = ['./engine.bench.ts', './verify.bench.ts'];

const figures: Record<string, unknown> = {};
for (const path of suites) {
  let mod: { run?: () => Promise<Record<string, unknown>> };
  try {
    mod = await import(path);
  } catch (err) {
    if ((err as { code?: string }).code === 'ERR_MODULE_NOT_FOUND') continue;
    throw err;
  }
  if (typeof mod.run !== 'function') continue;
  const out = await mod.run();
  Object.assign(figures, out);
}
console.log(JSON.stringify(figures));
