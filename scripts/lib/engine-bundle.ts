/**
 * The engine (`shared/engine/index.ts`) bundled and minified as the app bundles it, as one script
 * that sets `window.BrinelineEngine`: for benchmarks that time the engine inside Chromium.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { build, type Rolldown } from 'vite';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

export async function engineBundle(): Promise<string> {
  const out = (await build({
    configFile: false,
    logLevel: 'error',
    resolve: { alias: { '@shared': path.join(ROOT, 'shared') } },
    build: { write: false, minify: true, lib: { entry: path.join(ROOT, 'shared/engine/index.ts'), formats: ['iife'], name: 'BrinelineEngine' } },
  })) as Rolldown.RolldownOutput[];
  // tsx names the functions it compiles with a helper the page lacks
  return `globalThis.__name = (f) => f;\n${out[0].output[0].code}`;
}
