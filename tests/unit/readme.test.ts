import { describe, it, expect } from 'vitest';
import { readFileSync, writeFileSync, mkdirSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';

// The README's examples must run exactly as written, against the built
// package (npm test builds dist/ before vitest runs). Each `console.log(...)
// // expected` line states its own output, and that is what is checked.
const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const readme = readFileSync(join(root, 'README.md'), 'utf8');
const blocks = [...readme.matchAll(/```js\n([\s\S]*?)```/g)].map((m) => m[1]);

describe('README examples', () => {
  it('has at least one runnable example', () => {
    expect(blocks.length).toBeGreaterThan(0);
  });
  blocks.forEach((code, k) => {
    it(`example ${k + 1} runs and prints what its comments say`, () => {
      // Inside the repo so that `import 'ambit'` resolves to this package by self-reference.
      const dir = join(root, '.test-report');
      mkdirSync(dir, { recursive: true });
      const file = join(dir, `readme-example-${k + 1}.mjs`);
      writeFileSync(file, code);
      // Once, a child node sat idle (no CPU time) before running anything until CI was stopped; the example then
      // ran in 0.2 s forty times in a row. A run that takes over a minute is killed and tried once more: an example
      // that really hangs (everything here is deterministic) hangs again and fails.
      const run = (): string => execFileSync(process.execPath, [file], { encoding: 'utf8', timeout: 60_000 });
      let text: string;
      try {
        text = run();
      } catch (err) {
        if ((err as { signal?: string }).signal !== 'SIGTERM') throw err;
        text = run();
      }
      const out = text.trim().split('\n');
      const expected = code.split('\n').filter((l) => /^\s*console\.log\(.*\/\/\s*(.+)$/.test(l))
        .map((l) => l.replace(/^.*\/\/\s*/, '').trim());
      expect(expected.length).toBeGreaterThan(0);
      expect(out.map((l) => l.trim())).toEqual(expected);
    });
  });
});
