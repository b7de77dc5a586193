// `run --junit FILE`: the verdict as JUnit XML, the report format CI servers already display. One
// test case per limit the run was judged by; a failure says what was measured and what is allowed;
// a limit the plan cannot measure is skipped. The session's address is a suite property.
import { LIMIT_MEANINGS } from '../shared/link-engine/limits';
import type { RunReport } from './run-report';
import type { LimitCheck } from './run-verdict';

/** What the JUnit document reads of a run's report: a rotating or a vectoring run's. */
export type JunitRun = Pick<RunReport, 'core' | 'build' | 'board' | 'device' | 'planText' | 'status' | 'elapsedMs' | 'verdict' | 'archive'> & {
  score: { answered: number; total: number };
};

/** Text and attribute values: the five XML specials escaped, characters XML 1.0 forbids dropped. */
export function xmlEscape(text: string): string {
  return text
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

const figure = (v: number) => (Number.isInteger(v) ? String(v) : v.toPrecision(6).replace(/\.?0+$/, ''));

/** "measured 3 LSB, allowed at most 2 LSB" */
export function limitMessage(c: LimitCheck): string {
  const m = LIMIT_MEANINGS[c.key];
  const allowed = `allowed ${m.atMost ? 'at most' : 'at least'} ${figure(c.limit)} ${m.unit}`;
  if (c.value === null) return `not measured (${c.note ?? 'this plan cannot measure it'}); ${allowed}`;
  return `measured ${figure(c.value)} ${m.unit}, ${allowed}${c.note ? ` (${c.note})` : ''}`;
}

/**
 * The JUnit document for one judged run.
 * @param sessionUrl  the saved session's address, when the run was uploaded
 */
export function junitXml(r: JunitRun, sessionUrl: string | null): string {
  const suiteName = `anglebench run: ${r.core}`;
  const seconds = (r.elapsedMs / 1000).toFixed(3);
  const checks = r.verdict.checks;
  const failures = checks.filter((c) => c.outcome === 'fail').length;
  const skipped = checks.filter((c) => c.outcome === 'skip').length;
  const a = (name: string, value: string) => ` ${name}="${xmlEscape(value)}"`;
  const properties: [string, string | null][] = [
    ['session', sessionUrl],
    ['core', r.core],
    ['build', r.build],
    ['board', r.board],
    ['device', r.device],
    ['plan', r.planText],
    ['status', r.status],
    ['answered', `${r.score.answered} of ${r.score.total}`],
    ['archive', r.archive],
  ];
  const lines = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<testsuites${a('name', 'anglebench')}${a('tests', String(checks.length))}${a('failures', String(failures))}${a('errors', '0')}${a('skipped', String(skipped))}${a('time', seconds)}>`,
    `  <testsuite${a('name', suiteName)}${a('tests', String(checks.length))}${a('failures', String(failures))}${a('errors', '0')}${a('skipped', String(skipped))}${a('time', seconds)}>`,
    '    <properties>',
    ...properties.filter(([, v]) => v !== null).map(([k, v]) => `      <property${a('name', k)}${a('value', v!)}/>`),
    '    </properties>',
  ];
  for (const c of checks) {
    const m = LIMIT_MEANINGS[c.key];
    const open = `    <testcase${a('name', `${c.key}: ${m.name}`)}${a('classname', `anglebench.${r.core}`)}${a('time', '0')}`;
    const message = limitMessage(c);
    if (c.outcome === 'pass') lines.push(`${open}/>`);
    else if (c.outcome === 'skip') lines.push(`${open}>`, `      <skipped${a('message', message)}/>`, '    </testcase>');
    else {
      lines.push(
        `${open}>`,
        `      <failure${a('message', message)}${a('type', 'limit')}>${xmlEscape(`${m.explain}\n${message}`)}</failure>`,
        '    </testcase>',
      );
    }
  }
  lines.push('  </testsuite>', '</testsuites>', '');
  return lines.join('\n');
}
