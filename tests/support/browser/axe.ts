/**
 * axe-core (Deque's accessibility engine, the `axe-core` npm package) run in a playwright page: the
 * rules tagged for WCAG 2.0 and 2.1, levels A and AA, and only what axe rates "serious" or "critical"
 * kept as a failure. axe's own documentation lists the tags and the four impact levels (minor, moderate,
 * serious, critical).
 */
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';

const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

/** WCAG 2.0 and 2.1 at levels A and AA, as axe tags its rules. */
export const wcagTags = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] as const;
const failingImpacts = new Set(['serious', 'critical']);

/** One failing element: which rule, how bad, where (axe's CSS selector) and on which screen. */
export type AxeFinding = {
  screen: string;
  rule: string;
  impact: string;
  target: string;
  /** axe's one-line help and the first line of its failure summary for the element. */
  help: string;
};

/**
 * A rule set aside for one element only, never for the page: `target` is matched against axe's selector
 * for the element (exactly, or by a regular expression); `why` says why the markup cannot be fixed here.
 */
export type AxeExemption = { rule: string; target: string | RegExp; why: string };

const exempt = (exemptions: readonly AxeExemption[], rule: string, target: string) =>
  exemptions.some(
    (e) => e.rule === rule && (typeof e.target === 'string' ? e.target === target : e.target.test(target)),
  );

type AxeNode = { target: unknown[]; failureSummary?: string };
type AxeViolation = { id: string; impact?: string | null; help: string; nodes: AxeNode[] };

/**
 * Runs axe on the page as it stands (injecting the engine first when the page has none: a navigation
 * drops it) and returns the serious and critical violations, one entry per element.
 */
export async function axeViolations(
  page: Page,
  screen: string,
  exemptions: readonly AxeExemption[] = [],
): Promise<AxeFinding[]> {
  // page.evaluate runs outside the page's Content-Security-Policy, which refuses inline <script> tags.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(axeSource);
  const violations = await page.evaluate(
    (tags) =>
      (
        window as unknown as {
          axe: { run: (ctx: Document, o: object) => Promise<{ violations: AxeViolation[] }> };
        }
      ).axe
        .run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] })
        .then((r) =>
          r.violations.map((v) => ({
            id: v.id,
            impact: v.impact,
            help: v.help,
            nodes: v.nodes.map((n) => ({ target: n.target, failureSummary: n.failureSummary })),
          })),
        ),
    [...wcagTags],
  );
  const found: AxeFinding[] = [];
  for (const v of violations) {
    if (!v.impact || !failingImpacts.has(v.impact)) continue;
    for (const node of v.nodes) {
      const target = node.target.map(String).join(' >> ');
      if (exempt(exemptions, v.id, target)) continue;
      const detail = (node.failureSummary ?? '').split('\n').slice(1, 2).join('').trim();
      found.push({
        screen,
        rule: v.id,
        impact: v.impact,
        target,
        help: detail ? `${v.help}: ${detail}` : v.help,
      });
    }
  }
  return found;
}

/** One line per finding, for a failure message: `[impact] rule · screen · target — help`. */
export const formatFinding = (f: AxeFinding) =>
  `[${f.impact}] ${f.rule} · ${f.screen} · ${f.target} — ${f.help}`;
