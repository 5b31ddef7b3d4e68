import { defineConfig } from 'tsup';

export default defineConfig({
  entry: ['src/index.ts'],
  format: ['esm', 'cjs'],
  dts: true,
  sourcemap: true,
  clean: true,
  target: 'es2022',
  platform: 'neutral',
  // The runtime dependencies stay external: users get one copy of each.
  external: ['robust-predicates', 'tinyqueue'],
});
