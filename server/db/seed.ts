// Demo data for the first start of an empty database: four invented accounts and, when the
// example designs exist, a short history (one released set, one revision in review, one sent back).
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Role } from '../../shared/api/common';
import type { AppContext, UserActor } from '../middleware/context';
import { countUsers, insertUser } from '../users/repository';
import { hashPassword } from '../users/service';
import { record } from '../audit/service';
import { createDesign } from '../designs/service';
import { submitRevision } from '../revisions/service';
import { decide } from '../reviews/service';
import { release } from '../releases/service';
import { parseDesign } from '../../shared/api/design';
import { analyzeDesign } from '../../shared/control';

// Error checks of an example (Infinity when it does not parse or analyse), so the released demo set is one that may be released.
function errorCount(candidate: unknown): number {
  const parsed = parseDesign(candidate);
  if (!parsed.ok) return Infinity;
  try {
    return analyzeDesign(parsed.design, { sweepPoints: 0, responseSamples: 0 }).checks.filter((c) => c.severity === 'error').length;
  } catch {
    return Infinity;
  }
}

/** The demo password (the README tells operators to change it). */
export const DEMO_PASSWORD = 'varsmith-demo';

/** The demo accounts (invented people). */
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'engineer@varsmith.test', name: 'Ines Okonkwo-Hale', role: 'engineer' },
  { email: 'reviewer@varsmith.test', name: 'Tomas Brevik', role: 'reviewer' },
  { email: 'tester@varsmith.test', name: 'Priya Vandermolen', role: 'tester' },
  { email: 'admin@varsmith.test', name: 'Sol Arriaga', role: 'admin' },
];

const examplesDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../examples');

function exampleDesigns(): unknown[] {
  let files: string[] = [];
  try {
    files = readdirSync(examplesDir).filter((f) => f.endsWith('.json')).sort();
  } catch {
    return [];
  }
  return files.map((f) => JSON.parse(readFileSync(path.join(examplesDir, f), 'utf8')) as unknown);
}

/**
 * Seeds an empty database (no accounts yet); does nothing otherwise.
 * @param app - services.
 * @returns true when it seeded.
 */
export async function seedIfEmpty(app: AppContext): Promise<boolean> {
  if ((await countUsers()) > 0) return false;
  const hash = await hashPassword(DEMO_PASSWORD);
  const actors = await app.db.write(async (t) => {
    const out: Partial<Record<Role, UserActor>> = {};
    for (const u of DEMO_USERS) {
      const row = await insertUser({ ...u, passwordHash: hash }, t);
      await record(t, null, 'user.create', 'user', row.id, { email: row.email, role: row.role, seed: true });
      out[u.role] = { kind: 'user', id: row.id, email: row.email, name: row.name, role: row.role };
    }
    return out as Record<Role, UserActor>;
  });
  // Cleanest examples first: the first becomes the released set, the last the one sent back.
  const designs = exampleDesigns().map((d) => ({ d, errors: errorCount(d) })).sort((a, b) => a.errors - b.errors).map((x) => x.d);
  const log = (m: string) => { if (app.config.logLevel !== 'silent') process.stderr.write(`${m}\n`); };
  const steps: ((d: unknown) => Promise<void>)[] = [
    async (d) => {
      const design = await createDesign(app, actors.engineer, d);
      const rev = await submitRevision(app, actors.engineer, design.id, 'First coefficient set for the bench unit');
      await decide(app, actors.reviewer, rev.id, { decision: 'approve', comment: 'Margins and resonance landing checked against the targets.' });
      await release(app, actors.engineer, rev.id, '1.0.0');
    },
    async (d) => {
      const design = await createDesign(app, actors.engineer, d);
      await submitRevision(app, actors.engineer, design.id, 'Initial tuning, waiting for review');
    },
    async (d) => {
      const design = await createDesign(app, actors.engineer, d);
      const rev = await submitRevision(app, actors.engineer, design.id, 'First tuning for the smaller controller');
      const errors = rev.analysis.checks.filter((c) => c.severity === 'error').map((c) => c.id);
      const comment = errors.length > 0
        ? `The checks report errors (${errors.join(', ')}); resolve them before this set can be released.`
        : 'Phase margin is thin at this crossover; lower it or justify the delay model.';
      await decide(app, actors.reviewer, rev.id, { decision: 'changes', comment });
    },
  ];
  for (let i = 0; i < Math.min(designs.length, steps.length); i++) {
    try {
      await steps[i](designs[i]);
    } catch (err) {
      log(`demo history step ${i + 1} skipped: ${(err as Error).message}`);
    }
  }
  return true;
}
