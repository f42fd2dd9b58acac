/** Debian's Chromium driven by playwright-core: no browser downloads. */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser } from 'playwright-core';
import { ROOT } from './stack';

export const CHROMIUM = '/usr/bin/chromium';
export const SCREENSHOT_DIR = path.join(ROOT, 'test-results', 'screenshots');

/** Installs Debian's chromium package when it is missing (as root), else explains what to do. */
export function ensureChromium(): void {
  if (fs.existsSync(CHROMIUM)) return;
  if (process.getuid?.() !== 0) throw new Error('Chromium is missing: install it with `sudo apt-get install -y chromium`.');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  const res = spawnSync('apt-get', ['install', '-y', '-qq', 'chromium'], { stdio: 'inherit', env });
  if (res.status !== 0 || !fs.existsSync(CHROMIUM)) throw new Error('apt-get could not install chromium.');
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
