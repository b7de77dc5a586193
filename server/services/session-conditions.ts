// A session's operating conditions and soak books (table session_conditions): written with the
// session, read back in the API's shape, and the list's condition range filters.
import { literal, Op, type Transaction } from 'sequelize';
import { CONDITION_FILTERS, type ConditionFilter, type SessionListQuery } from '../../shared/contract/sessions';
import type { Conditions, NamedCondition, SoakRecord } from '../../shared/soak';
import { SessionConditions } from '../db/models';

const COLUMN: Record<NamedCondition, 'temperatureC' | 'vccintV' | 'clockMhz'> = { temperature_c: 'temperatureC', vccint_v: 'vccintV', clock_mhz: 'clockMhz' };

/** Store what the upload said; nothing when it gave neither conditions nor a soak. */
export async function saveSessionConditions(transaction: Transaction, sessionId: number, conditions: Conditions | undefined, soak: SoakRecord | undefined) {
  const c = conditions ?? {};
  const hasConditions = Object.keys(c).some((k) => k !== 'other') || Object.keys(c.other ?? {}).length > 0;
  if (!hasConditions && !soak) return null;
  return SessionConditions.create(
    {
      sessionId,
      temperatureC: c.temperature_c ?? null,
      vccintV: c.vccint_v ?? null,
      clockMhz: c.clock_mhz ?? null,
      other: c.other && Object.keys(c.other).length > 0 ? c.other : null,
      soakPasses: soak?.summary.passes ?? null,
      unstableCodes: soak?.unstable.count ?? null,
      soak: soak ?? null,
    },
    { transaction },
  );
}

/** A session's conditions alone (`{}` when none were recorded): for the CSV export. */
export async function sessionConditionsOf(sessionId: number): Promise<Conditions> {
  const row = await SessionConditions.findOne({ where: { sessionId }, attributes: { exclude: ['soak'] } });
  return row ? row.conditions() : {};
}

/** What a list item or a detail shows; the soak's books only in the detail. */
export function conditionsView(row: SessionConditions | null | undefined, { withSoak }: { withSoak: boolean }) {
  return {
    conditions: row ? row.conditions() : {},
    soakPasses: row?.soakPasses ?? null,
    unstableCodes: row?.unstableCodes ?? null,
    ...(withSoak ? { soak: row?.soak ?? null } : {}),
  };
}

/**
 * The list's condition range filters, as one condition on the sessions' id (a subquery on the
 * indexed columns); null when none is given. Bounds are numbers checked by the contract.
 */
export function conditionRangeWhere(q: SessionListQuery) {
  const parts: string[] = [];
  for (const [key, [name, side]] of Object.entries(CONDITION_FILTERS) as Array<[ConditionFilter, readonly [NamedCondition, 'min' | 'max']]>) {
    const v = q[key];
    if (v === undefined) continue;
    parts.push(`"${COLUMN[name]}" ${side === 'min' ? '>=' : '<='} ${Number(v)}`);
  }
  if (parts.length === 0) return null;
  return { id: { [Op.in]: literal(`(SELECT "sessionId" FROM "session_conditions" WHERE ${parts.join(' AND ')})`) } };
}
