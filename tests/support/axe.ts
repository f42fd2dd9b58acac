/** axe-core in the browser tests: WCAG 2.x A/AA rules, and no violation of serious or critical impact. */
import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { ROOT } from './stack';

const AXE = path.join(ROOT, 'node_modules', 'axe-core', 'axe.min.js');

interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: unknown[]; failureSummary?: string }[];
}

/** Runs axe on the page as it is now and returns the serious and critical violations, in words. */
export async function seriousA11yViolations(page: Page): Promise<string[]> {
  // The app's Content-Security-Policy refuses an injected <script> (page.addScriptTag); evaluating the
  // source through the DevTools protocol is not subject to it and leaves the policy as users get it.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(fs.readFileSync(AXE, 'utf8'));
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: unknown) => Promise<{ violations: AxeViolation[] }> } }).axe;
    const res = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } });
    return res.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.slice(0, 3).map((n) => ({ target: n.target, failureSummary: n.failureSummary })) }));
  });
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.map((n) => JSON.stringify(n.target)).join(', ')}`);
}
