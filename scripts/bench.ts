// `npm run bench`: runs every scripts/bench/*.ts (each exports `run(): Promise<Record<string, unknown>>`)
// and prints one JSON object with their figures. Numbers only, no assertions.
import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';

const dir = fileURLToPath(new URL('./bench/', import.meta.url));
const out: Record<string, unknown> = { node: process.version, date: new Date().toISOString() };
for (const file of readdirSync(dir).filter((f) => f.endsWith('.ts')).sort()) {
  const mod = (await import(join(dir, file))) as { run: () => Promise<Record<string, unknown>> };
  out[file.replace(/\.ts$/, '')] = await mod.run();
}
process.stdout.write(`${JSON.stringify(out, null, 2)}\n`);
