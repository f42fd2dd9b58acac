/** Debian's Chromium driven by playwright-core: no browser downloads. */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser } from 'playwright-core';
import { ROOT } from './stack';

export const CHROMIUM = '/usr/bin/chromium';
export const SCREENSHOT_DIR = path.join(ROOT, 'test-results', 'screenshots');

/**
 * Debian's packages the browser tests use: Chromium, and poppler-utils (pdfinfo, pdftotext) to read
 * a printed PDF as a reader would. Installs what is missing (as root), else explains what to do.
 */
const PACKAGES: readonly { bin: string; pkg: string }[] = [
  { bin: CHROMIUM, pkg: 'chromium' },
  { bin: '/usr/bin/pdftotext', pkg: 'poppler-utils' },
];

export function ensureChromium(): void {
  const missing = PACKAGES.filter((p) => !fs.existsSync(p.bin));
  if (missing.length === 0) return;
  const names = missing.map((p) => p.pkg);
  if (process.getuid?.() !== 0) throw new Error(`Missing Debian packages: install them with \`sudo apt-get install -y ${names.join(' ')}\`.`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  const res = spawnSync('apt-get', ['install', '-y', '-qq', ...names], { stdio: 'inherit', env });
  if (res.status !== 0 || missing.some((p) => !fs.existsSync(p.bin))) throw new Error(`apt-get could not install ${names.join(' ')}.`);
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-quic',
      '--no-first-run',
      '--disable-component-update',
      '--disable-sync',
      // Software WebGL, so the 3D view renders with no GPU.
      '--use-angle=swiftshader',
      '--enable-unsafe-swiftshader',
    ],
  });
}

export function screenshotPath(name: string): string {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  return path.join(SCREENSHOT_DIR, `${name}.png`);
}
