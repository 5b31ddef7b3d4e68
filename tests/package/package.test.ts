import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

// These checks read the built package in dist/ (the test command builds it first with tsup).
const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { dependencies: Record<string, string> };

function run(cmd: string, args: string[]): { status: number | null; out: string } {
  const r = spawnSync(cmd, args, { cwd: root, encoding: 'utf8', timeout: 120_000 });
  return { status: r.status, out: `${r.stdout}\n${r.stderr}` };
}

// The same small diagram from either module system, printed as text: the two must agree byte for byte.
const script = (load: string): string => `
  const a = ${load};
  const d = a.voronoi([[0, 0], [4, 1], [1, 3], [3, 4], [2, 2]], { clip: { minX: -1, minY: -1, maxX: 5, maxY: 5 } });
  console.log(a.writeMeshJSON(d.mesh) + '|' + Array.from(d.cellAreas()).join(','));
`;

describe('the published package', () => {
  it('loads as ESM and as CommonJS by its own name, with the same results', () => {
    const esm = execFileSync(process.execPath, ['--input-type=module', '-e', script("await import('ambit')")], { cwd: root, encoding: 'utf8' });
    const cjs = execFileSync(process.execPath, ['-e', script("require('ambit')")], { cwd: root, encoding: 'utf8' });
    expect(esm.length).toBeGreaterThan(100);
    expect(cjs).toBe(esm);
  });

  it('npm pack ships the build, the README, the licence and package.json, nothing else', () => {
    const r = run('npm', ['pack', '--dry-run', '--json', '--ignore-scripts']);
    expect(r.status, r.out).toBe(0);
    const listing = JSON.parse(r.out.slice(r.out.indexOf('['), r.out.lastIndexOf(']') + 1)) as { files: { path: string }[] }[];
    const files = listing[0].files.map((f) => f.path).sort();
    for (const need of ['LICENSE', 'README.md', 'package.json', 'dist/index.js', 'dist/index.cjs', 'dist/index.d.ts', 'dist/index.d.cts']) {
      expect(files, `${need} is shipped`).toContain(need);
    }
    const stray = files.filter((f) => !/^(dist\/|README\.md$|LICENSE$|package\.json$)/.test(f));
    expect(stray, 'files outside dist/ that users do not need').toEqual([]);
  });

  it('publint finds nothing to fix (strict)', async () => {
    const { publint } = await import('publint');
    const { messages } = await publint({ pkgDir: root, strict: true });
    expect(messages.map((m) => `${m.type} ${m.code} ${m.path.join('.')}`)).toEqual([]);
  });

  it('@arethetypeswrong/cli finds no type resolution problem in any module system', () => {
    const r = run(process.execPath, [join(root, 'node_modules', '@arethetypeswrong', 'cli', 'dist', 'index.js'), '--pack', '.', '--format', 'json']);
    const report = JSON.parse(r.out.slice(r.out.indexOf('{'), r.out.lastIndexOf('}') + 1)) as { problems?: unknown[] | Record<string, unknown> };
    const problems = Array.isArray(report.problems) ? report.problems : Object.values(report.problems ?? {});
    expect(problems, r.out.slice(0, 2000)).toEqual([]);
    expect(r.status, r.out.slice(0, 2000)).toBe(0);
  });

  it('npm run docs: the API reference builds from the doc comments with no warning (typedoc.json treats them as errors)', () => {
    const out = mkdtempSync(join(tmpdir(), 'ambit-docs-'));
    try {
      const r = run(process.execPath, [join(root, 'node_modules', 'typedoc', 'bin', 'typedoc'), '--out', out]);
      expect(r.status, r.out).toBe(0);
      expect(readFileSync(join(out, 'index.html'), 'utf8')).toContain('voronoi');
    } finally {
      rmSync(out, { recursive: true, force: true });
    }
  });

  it('has only the two runtime dependencies the README names', () => {
    expect(Object.keys(pkg.dependencies).sort()).toEqual(['robust-predicates', 'tinyqueue']);
  });
});
