/// <reference types="vitest/config" />
import { resolve } from 'node:path';
import preact from '@preact/preset-vite';
import { defineConfig, type Plugin, type UserConfig } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

const projectRoot = import.meta.dirname;

/**
 * The app shell as one chunk: every module that web/main.tsx imports statically (the studies list, the
 * field screen, storage). Left to itself the bundler cuts the modules that the lazily loaded screens share
 * with the shell into many small chunks, each one more request and module to fetch, compile and link
 * before the first frame. The set is walked from the entry's static imports once the graph is built.
 */
function shellChunk(): Plugin & { shell: Set<string> } {
  const shell = new Set<string>();
  return {
    name: 'sure-enough-shell-chunk',
    shell,
    buildEnd() {
      shell.clear();
      const entry = resolve(projectRoot, 'web/main.tsx');
      const queue = [entry];
      while (queue.length > 0) {
        const id = queue.pop() as string;
        if (shell.has(id)) continue;
        shell.add(id);
        for (const dep of this.getModuleInfo(id)?.importedIds ?? []) queue.push(dep);
      }
    },
  };
}

// `vite build --mode cli` bundles the Node command line (and the coverage benchmark) from the pure core.
// `vite build --mode server` bundles the crew server (dist-server/).
// Any other mode builds the phone app from web/ (index.html lives there).
export default defineConfig(({ mode }): UserConfig => {
  if (mode === 'cli') {
    return {
      root: projectRoot,
      publicDir: false,
      logLevel: 'warn',
      // jstat is CommonJS without named exports for Node's ESM loader: bundle it into the CLI.
      ssr: { noExternal: ['jstat'] },
      build: {
        ssr: true,
        outDir: resolve(projectRoot, 'dist-cli'),
        emptyOutDir: true,
        target: 'node20',
        rollupOptions: {
          input: {
            'sure-enough': resolve(projectRoot, 'src/cli/main.ts'),
            'coverage-bench': resolve(projectRoot, 'test/bench/coverage-bench.ts'),
            'replay-bench': resolve(projectRoot, 'test/bench/replay-bench.ts'),
          },
          output: { entryFileNames: '[name].mjs', format: 'es' },
        },
      },
    };
  }
  if (mode === 'server') {
    // the crew server (src/server) and its load benchmark; hono, pg and PGlite stay external (PGlite
    // loads its WebAssembly from its own package folder)
    return {
      root: projectRoot,
      publicDir: false,
      logLevel: 'warn',
      ssr: { noExternal: ['jstat'] },
      build: {
        ssr: true,
        outDir: resolve(projectRoot, 'dist-server'),
        emptyOutDir: true,
        target: 'node20',
        rollupOptions: {
          input: {
            server: resolve(projectRoot, 'src/server/main.ts'),
            'server-load': resolve(projectRoot, 'test/bench/server-load.ts'),
          },
          output: { entryFileNames: '[name].mjs', format: 'es' },
        },
      },
    };
  }
  const testing = process.env.VITEST !== undefined;
  const shell = shellChunk();
  return {
    root: resolve(projectRoot, 'web'),
    publicDir: resolve(projectRoot, 'public'),
    define: { __APP_VERSION__: JSON.stringify(process.env.APP_VERSION ?? '0.1.0') },
    build: {
      outDir: resolve(projectRoot, 'dist'),
      emptyOutDir: true,
      target: 'es2022',
      rolldownOptions: {
        output: { codeSplitting: { groups: [{ name: 'shell', test: (id: string) => shell.shell.has(id) }] } },
      },
    },
    preview: { port: 4173, strictPort: true },
    plugins: [
      shell,
      preact(),
      ...(testing
        ? []
        : [
            VitePWA({
              strategies: 'injectManifest',
              srcDir: 'sw',
              filename: 'sw.ts',
              registerType: 'prompt',
              injectRegister: false,
              manifest: {
                name: 'Sure Enough — field sampling',
                short_name: 'Sure Enough',
                description: 'Records field observations offline and says when you have enough.',
                start_url: '/',
                scope: '/',
                display: 'standalone',
                orientation: 'portrait',
                background_color: '#f4f1e8',
                theme_color: '#17324d',
                icons: [
                  { src: 'icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
                  { src: 'icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
                  { src: 'icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
                ],
              },
              injectManifest: { globPatterns: ['**/*.{js,css,html}'] },
            }),
          ]),
    ],
    test: {
      root: projectRoot,
      include: ['test/**/*.test.{ts,tsx}'],
      // the command line is built once for every test file that runs it (test/global-setup.ts)
      globalSetup: ['test/global-setup.ts'],
      environment: 'node',
      testTimeout: 30_000,
    },
  };
});
