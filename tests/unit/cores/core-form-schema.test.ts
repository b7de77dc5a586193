import { describe, expect, it } from 'vitest';
import { coreFormSchema, formValuesOf, readNumber, toPayload, type CoreFormValues, type Issue } from '../../../src/features/cores/components/core-form-schema';
import type { CoreRecord } from '../../../src/lib/resources/cores';

const defaults = (): CoreFormValues => ({ ...formValuesOf(null), name: 'Bring-up core', slug: 'bring-up' });
const messages = (v: CoreFormValues) => Object.fromEntries(toPayload(v).issues.map((i) => [i.path.join('.'), i.message]));

describe('reading a number typed into the core form', () => {
  const read = (text: string) => {
    const issues: Issue[] = [];
    return { n: readNumber(text, ['x'], issues), issue: issues[0]?.message };
  };
  it('takes plain, signed, decimal and exponent forms, and grouped thousands', () => {
    expect(read(' 42 ').n).toBe(42);
    expect(read('-0.25').n).toBe(-0.25);
    expect(read('.5').n).toBe(0.5);
    expect(read('1e3').n).toBe(1000);
    expect(read('3,000,000').n).toBe(3_000_000);
    expect(read('3 000 000').n).toBe(3_000_000);
  });
  it('leaves a blank field unset', () => {
    expect(read('   ')).toEqual({ n: undefined, issue: undefined });
  });
  it('refuses a decimal comma rather than misreading "0,5" as 5, and anything that is not a number', () => {
    expect(read('0,5')).toEqual({ n: undefined, issue: 'Enter a number, with a point for decimals' });
    expect(read('0,500').n).toBeUndefined();
    expect(read('0x10')).toEqual({ n: undefined, issue: 'Enter a number' });
    expect(read('four').issue).toBe('Enter a number');
  });
});

describe('the core form as an API body', () => {
  it('sends the default model and only the limits that were filled in', () => {
    const v = defaults();
    v.limits.maxAbsErrorLsb = '4';
    v.limits.minCoveragePct = '99.5';
    const { payload, issues } = toPayload(v);
    expect(issues).toEqual([]);
    expect(payload.limits).toEqual({ maxAbsErrorLsb: 4, minCoveragePct: 99.5 });
    expect(payload.linkProfile).toEqual({ baud: 3_000_000, crc: 'CRC-8/SMBUS' });
    expect(payload.modelConfig).toMatchObject({ angleFormat: 'turn', angleBits: 16, outBits: 16, outFrac: 14, iterations: 16, fold: true });
    expect('angleFrac' in payload.modelConfig).toBe(false); // only a radian angle has fraction bits
  });

  it('checks the model keys against the shared model schema, each at its own field', () => {
    const m = messages({ ...defaults(), angleBits: '33', iterations: '2.5' });
    expect(m.angleBits).toBe('Must be at most 32');
    expect(m.iterations).toBe('Must be a whole number');
    // The cross-key rule (docs/model.md: outFrac 0..outBits − 1) is checked once each key is in range.
    expect(messages({ ...defaults(), outFrac: '16' }).outFrac).toBe('Must be below outBits (16)');
  });

  it('checks the limits against the shared limits schema and the baud against the link profile', () => {
    const v = defaults();
    v.limits.maxRmsErrorLsb = '-1';
    v.limits.minCoveragePct = '101';
    v.limits.maxModelMismatches = '0.5';
    v.baud = '9599';
    const m = messages(v);
    expect(m['limits.maxRmsErrorLsb']).toBe('Must be at least 0');
    expect(m['limits.minCoveragePct']).toBe('Must be at most 100');
    expect(m['limits.maxModelMismatches']).toBe('Must be a whole number');
    expect(m.baud).toBe('A whole number from 9,600 to 12,000,000');
  });

  it('keeps a radian angle’s fraction bits, and a blank one is left to the model’s default', () => {
    const v = { ...defaults(), angleFormat: 'rad' as const, angleBits: '18', angleFrac: '15' };
    expect(toPayload(v).payload.modelConfig).toMatchObject({ angleFormat: 'rad', angleFrac: 15 });
    expect(messages({ ...v, angleFrac: '19' }).angleFrac).toBe('Must be at most angleBits (18)');
    expect('angleFrac' in toPayload({ ...v, angleFrac: '' }).payload.modelConfig).toBe(false);
  });

  it('is refused by the form schema at the same fields, so the errors show beside them', () => {
    const v = defaults();
    v.limits.maxAbsBiasLsb = 'abc';
    v.slug = 'Not A Slug';
    const r = coreFormSchema.safeParse(v);
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['limits.maxAbsBiasLsb', 'slug']));
  });

  it('reads a stored core back into the same text it was saved from', () => {
    const v = defaults();
    v.limits.maxAbsErrorLsb = '2.5';
    v.iterations = '18';
    const { payload } = toPayload(v);
    const stored = { id: 1, name: payload.name, slug: payload.slug, linkProfile: payload.linkProfile, modelConfig: { ...formModel(payload.modelConfig) }, limits: payload.limits, baselineSessionId: null, createdAt: '', updatedAt: '' } as CoreRecord;
    expect(formValuesOf(stored)).toEqual(v);
  });
});

/** As the server stores it: every key present (angleFrac 0 for a turn angle). */
function formModel(m: object) {
  return { angleFrac: 0, zGuardBits: 2, guardBits: 2, ...m };
}
