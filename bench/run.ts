/**
 * `npm run bench`: every benchmark, each running its reference in the same run
 * and printing the ratio. Pass names to run a subset: `npm run bench -- factors`.
 * `whole` (first) times whole processes as users run them; the others are
 * in-process figures, for diagnosis.
 * Speed and memory are measured here, never asserted in tests.
 */
const suites: Record<string, () => Promise<unknown>> = {
  whole: async () => (await import('./wholeProcess.js')).benchWholeProcess(),
  sphere: async () => (await import('./sphere.js')).benchSphere(),
  read: async () => (await import('./readMap.js')).benchReadMap(),
  factors: async () => (await import('./factors.js')).benchFactors(),
  templates: async () => (await import('./templates.js')).benchTemplates(),
  render: async () => (await import('./render.js')).benchRender(),
  physics: async () => (await import('./physics.js')).benchPhysics(),
  peakMemory: async () => (await import('./peakMemory.js')).benchPeakMemory(),
  cache: async () => (await import('./cache.js')).benchCache(),
  projection: async () => (await import('./projection.js')).benchProjection(),
  streaming: async () => (await import('./streaming.js')).benchStreaming(),
  survival: async () => (await import('./survival.js')).benchSurvival(),
};

const wanted = process.argv.slice(2);
const names = wanted.length ? wanted : Object.keys(suites);
for (const name of names) {
  const run = suites[name];
  if (!run) {
    console.error(`unknown benchmark '${name}'; known: ${Object.keys(suites).join(', ')}`);
    process.exitCode = 2;
    continue;
  }
  console.log(`\n== ${name} ==`);
  await run();
}
