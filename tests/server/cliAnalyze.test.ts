// `npx varsmith analyze` (CONTRACT section 4): JSON only on stdout, exit 0 / 1 / 2.
import { describe, it, expect } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../../', import.meta.url));
const run = (...args: string[]) => spawnSync(process.execPath, [join(root, 'bin/varsmith.mjs'), ...args], { cwd: root, encoding: 'utf8' });

describe('varsmith analyze', () => {
  it('prints the analysis JSON and exits 0 on a clean design', () => {
    const r = run('analyze', 'examples/sc3-bench-l-120v.json');
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const result = JSON.parse(r.stdout);
    expect(result.format).toBe('varsmith-analysis/1');
  });
  it('exits 1 when a check is an error', () => {
    const r = run('analyze', 'examples/sc2-port-16bit-230v.json');
    expect(r.status).toBe(1);
    expect(JSON.parse(r.stdout).checks.some((c: { severity: string }) => c.severity === 'error')).toBe(true);
  });
  it('exits 2 on invalid input with the key path on stderr and nothing on stdout', () => {
    const dir = mkdtempSync(join(tmpdir(), 'varsmith-cli-'));
    const design = JSON.parse(readFileSync(join(root, 'examples/sc3-bench-l-120v.json'), 'utf8'));
    design.filter.inductanceH = -1;
    const file = join(dir, 'bad.json');
    writeFileSync(file, JSON.stringify(design));
    const r = run('analyze', file);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/filter\.inductanceH/);
    const missing = run('analyze', join(dir, 'absent.json'));
    expect(missing.status).toBe(2);
  });
});
