import { panel, panelTitle } from '../../../components/ui';
import type { CoreRecord } from '../../../lib/resources/cores';
import { LIMIT_KEYS, LIMITS, LINK, MODEL, type ModelKey } from './core-meanings';

const num = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 6 });

function Row({ term, value, hint }: { term: string; value: string; hint: string }) {
  return (
    <div className="grid gap-0.5 border-b border-rule/60 pb-2 last:border-0">
      <dt className="flex justify-between gap-3 text-sm">
        <span className="font-bold">{term}</span>
        <span className="font-mono" data-testid={`value-${term}`}>
          {value}
        </span>
      </dt>
      <dd className="text-xs text-ink-soft">{hint}</dd>
    </div>
  );
}

const MODEL_ORDER: ModelKey[] = ['angleFormat', 'angleBits', 'angleFrac', 'outBits', 'outFrac', 'iterations', 'guardBits', 'zGuardBits', 'shiftRounding', 'outputRounding', 'fold'];

/** A vectoring core's configuration and limits, key by key (docs/model.md, "Vectoring cores"). */
function VectoringValues({ core }: { core: CoreRecord }) {
  const limits = Object.entries(core.limits).filter(([, v]) => v !== undefined);
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <section className={panel} aria-labelledby="v-vector">
        <h2 id="v-vector" className={panelTitle}>Vectoring model</h2>
        <dl className="grid gap-2">
          {Object.entries(core.vectorConfig ?? {}).map(([k, v]) => (
            <Row key={k} term={k} value={String(v)} hint="" />
          ))}
        </dl>
      </section>
      <section className={panel} aria-labelledby="v-vlimits">
        <h2 id="v-vlimits" className={panelTitle}>Acceptance limits</h2>
        <dl className="grid gap-2">
          {limits.length === 0 ? <p className="text-sm text-ink-soft">No limits set.</p> : limits.map(([k, v]) => <Row key={k} term={k} value={num(Number(v))} hint="" />)}
        </dl>
      </section>
    </div>
  );
}

/** The same three panels as the form, as values only: what a reviewer sees. */
export function CoreValues({ core }: { core: CoreRecord }) {
  const m = core.modelConfig;
  if (!m) return <VectoringValues core={core} />;
  const modelValue = (k: ModelKey) => (k === 'fold' ? (m.fold ? 'on' : 'off') : String(m[k]));
  return (
    <div className="grid gap-4 lg:grid-cols-3">
      <section className={panel} aria-labelledby="v-link">
        <h2 id="v-link" className={panelTitle}>Link profile</h2>
        <dl className="grid gap-2">
          <Row term={LINK.baud.label} value={`${num(core.linkProfile.baud)} bit/s`} hint={LINK.baud.explain} />
          <Row term={LINK.crc.label} value={core.linkProfile.crc} hint={LINK.crc.explain} />
        </dl>
      </section>
      <section className={panel} aria-labelledby="v-model">
        <h2 id="v-model" className={panelTitle}>Reference model</h2>
        <dl className="grid gap-2">
          {MODEL_ORDER.filter((k) => k !== 'angleFrac' || m.angleFormat === 'rad').map((k) => (
            <Row key={k} term={MODEL[k].label} value={modelValue(k)} hint={MODEL[k].explain} />
          ))}
        </dl>
      </section>
      <section className={panel} aria-labelledby="v-limits">
        <h2 id="v-limits" className={panelTitle}>Acceptance limits</h2>
        <dl className="grid gap-2">
          {LIMIT_KEYS.map((k) => {
            const v = core.limits[k];
            const l = LIMITS[k];
            return <Row key={k} term={l.label} value={v === undefined ? 'not checked' : `${l.bound} ${num(v)} ${l.unit}`} hint={l.explain} />;
          })}
        </dl>
      </section>
    </div>
  );
}
