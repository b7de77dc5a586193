// The WCAG 2.1 A/AA audit of axe-core, run inside a page: what a browser test asserts when it
// says a page is accessible.
import path from 'node:path';
import type { Page } from 'playwright-core';
import { projectRoot } from '../../server/paths';

/** The rule sets of WCAG 2.0 and 2.1, levels A and AA, as axe-core tags them. */
const WCAG_AA_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];

export interface AxeViolation {
  id: string;
  impact: 'minor' | 'moderate' | 'serious' | 'critical' | null;
  help: string;
  helpUrl: string;
  nodes: { target: unknown[]; failureSummary?: string }[];
}

/** axe-core in the page (once). */
async function loadAxe(page: Page) {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ path: path.join(projectRoot, 'node_modules/axe-core/axe.min.js') });
}

/** Run the audit on what `page` shows now and return the serious and critical violations. */
export async function seriousViolations(page: Page): Promise<AxeViolation[]> {
  await loadAxe(page);
  const violations = await page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: AxeViolation[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: tags } });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, helpUrl: v.helpUrl, nodes: v.nodes.map((n) => ({ target: n.target, failureSummary: n.failureSummary })) }));
  }, WCAG_AA_TAGS);
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

/**
 * Landmarks that repeat one another (two banners, two regions of the same name…), of any impact:
 * axe files these under best practice, but a screen reader's list of landmarks gets them all.
 */
export async function landmarkViolations(page: Page): Promise<AxeViolation[]> {
  await loadAxe(page);
  return page.evaluate(async (rules) => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: AxeViolation[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'rule', values: rules } });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, helpUrl: v.helpUrl, nodes: v.nodes.map((n) => ({ target: n.target, failureSummary: n.failureSummary })) }));
  }, LANDMARK_RULES);
}

const LANDMARK_RULES = ['landmark-unique', 'landmark-no-duplicate-banner', 'landmark-no-duplicate-contentinfo', 'landmark-no-duplicate-main', 'landmark-main-is-top-level', 'landmark-banner-is-top-level'];

/** One line per element at fault: rule id, impact, the element's selector and the rule's help text. */
export function describeViolations(violations: AxeViolation[]): string {
  return violations
    .flatMap((v) => v.nodes.map((n) => `${v.id} (${v.impact}) at ${JSON.stringify(n.target)}: ${v.help}${n.failureSummary ? ` — ${n.failureSummary.replace(/\s+/g, ' ')}` : ''}`))
    .join('\n');
}
