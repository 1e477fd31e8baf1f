/**
 * `npm run bench`: speed and memory of the engine, printed as figures and
 * ratios. Never run by the tests; nothing here asserts a time.
 * Each part lives in its own file and exports `run(): Promise<void>`.
 */
const parts: { name: string; load: () => Promise<{ run: () => Promise<void> }> }[] = [
  { name: "layout reader: DXF to network", load: () => import("./geometry") },
  { name: "outline reader: mask to network", load: () => import("./outline") },
  { name: "hydraulics solve", load: () => import("./solve") },
  { name: "chip drawing in headless Chromium", load: () => import("./drawing") },
];

const only = process.argv[2];
for (const part of parts) {
  if (only && !part.name.includes(only)) continue;
  console.log(`\n== ${part.name} ==`);
  const mod = await part.load();
  await mod.run();
}

export {};
