// Bundles the checker/server and the VS Code client with esbuild.
// Type-checking is a separate step (`npm run typecheck`); esbuild only strips types.
import { build } from 'esbuild';

const common = { bundle: true, platform: 'node', format: 'cjs', target: 'node20', sourcemap: true, logLevel: 'warning' };

await Promise.all([
  build({ ...common, entryPoints: ['server/src/main.ts'], outfile: 'dist/waveplan.js' }),
  build({ ...common, entryPoints: ['client/src/extension.ts'], outfile: 'dist/extension.js', external: ['vscode'] }),
]);
