import { defineConfig } from 'tsup';

export default defineConfig([{
  entry: ['src/index.ts'],
  format: ['esm', 'cjs'],
  dts: true,
  sourcemap: true,
  clean: true,
  target: 'es2022',
  platform: 'neutral',
  // The runtime dependencies stay external: users get one copy of each.
  external: ['robust-predicates', 'tinyqueue'],
}, {
  // The command line (package.json "bin"): one Node ESM file; it must not clean dist/, which the library build fills.
  entry: { cli: 'src/cli/main.ts' },
  format: ['esm'],
  dts: false,
  sourcemap: true,
  clean: false,
  target: 'es2022',
  platform: 'node',
  banner: { js: '#!/usr/bin/env node' },
  external: ['robust-predicates', 'tinyqueue'],
}]);
