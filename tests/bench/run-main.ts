// Runs a bench's `run()` when its file is the script node was started with: a hard time limit
// (in case something hangs), the figures as JSON on the last line, exit 1 on failure.
export function runAsScript(moduleUrl: string, name: string, limitMs: number, run: () => Promise<Record<string, unknown>>): void {
  if (moduleUrl !== `file://${process.argv[1]}`) return;
  const limit = setTimeout(() => {
    console.error(`[${name}] gave up after ${limitMs / 60_000} minutes`);
    process.exit(1);
  }, limitMs);
  limit.unref();
  run()
    .then((figures) => {
      console.log(JSON.stringify(figures));
      process.exit(0);
    })
    .catch((err) => {
      console.error(err);
      process.exit(1);
    });
}
