import { describe, expect, it } from 'vitest';
import { Kind } from '../../../shared/link/kinds';
import { RunLedger, type NeedsConfirming } from '../../../shared/link-engine/run-ledger';

const codes = Float64Array.from([100, 200, 300]);
const results = (firstIndex: number, pairs: Array<[number, number]>) => ({
  kind: Kind.Results,
  firstIndex,
  cos: Int32Array.from(pairs, (p) => p[0]),
  sin: Int32Array.from(pairs, (p) => p[1]),
});
/** The reference says every code answers (1000, 0); anything else is worth confirming. */
const offModel: NeedsConfirming = (_i, cos, sin) => cos !== 1000 || sin !== 0;

function listOf(ledger: RunLedger, tag: number, indexes: number[]) {
  ledger.open(tag, Kind.List, Uint32Array.from(indexes), indexes.length);
  return ledger.request(tag)!;
}

describe('the run ledger', () => {
  it('takes each code once and counts later answers as duplicates', () => {
    const ledger = new RunLedger(codes, 8);
    const req = listOf(ledger, 1, [0, 1, 2]);
    const first = ledger.results(req, results(0, [[1000, 0], [1000, 0], [1000, 0]]), null);
    expect(Array.from(first.batch!.indexes)).toEqual([0, 1, 2]);
    expect(ledger.complete).toBe(true);
    expect(ledger.results(req, results(0, [[5, 5]]), null)).toEqual({ batch: null, duplicates: 1, held: 0 });
    expect(ledger.cos[0]).toBe(1000);
  });

  it('holds an answer off the model until a second, equal one confirms it', () => {
    const ledger = new RunLedger(codes, 8);
    const req = listOf(ledger, 1, [0, 1]);
    const r = ledger.results(req, results(0, [[1000, 0], [999, 3]]), offModel);
    expect(r.held).toBe(1);
    expect(Array.from(r.batch!.indexes)).toEqual([0]);
    expect(ledger.close(req)).toEqual([1]); // still open: asked again
    expect(ledger.requeue(1)).toBe('retry');
    const again = listOf(ledger, 2, [1]);
    const confirmed = ledger.results(again, results(0, [[999, 3]]), offModel);
    expect(confirmed.held).toBe(0);
    expect(Array.from(confirmed.batch!.cos)).toEqual([999]);
    expect(ledger.answeredMask()).toEqual(Uint8Array.of(1, 1, 0));
  });

  it('takes the answer the reference agrees with when the held one was damage', () => {
    const ledger = new RunLedger(codes, 8);
    const req = listOf(ledger, 1, [2]);
    ledger.results(req, results(0, [[-31000, 77]]), offModel);
    ledger.close(req);
    ledger.requeue(2);
    const again = listOf(ledger, 2, [2]);
    const r = ledger.results(again, results(0, [[1000, 0]]), offModel);
    expect(Array.from(r.batch!.indexes)).toEqual([2]);
    expect([ledger.cos[2], ledger.sin[2]]).toEqual([1000, 0]);
  });

  it('asks again after two different doubtful answers, and takes the last one once the retries are spent', () => {
    const ledger = new RunLedger(codes, 1);
    let req = listOf(ledger, 1, [0]);
    ledger.results(req, results(0, [[7, 7]]), offModel);
    ledger.close(req);
    expect(ledger.requeue(0)).toBe('retry');
    req = listOf(ledger, 2, [0]);
    expect(ledger.results(req, results(0, [[8, 8]]), offModel).held).toBe(1);
    ledger.close(req);
    expect(ledger.requeue(0)).toBe('taken unconfirmed');
    expect([ledger.cos[0], ledger.sin[0]]).toEqual([8, 8]);
    expect(ledger.missing).toEqual([]);
  });

  it('lists a code missing after its retries when nothing was ever heard of it', () => {
    const ledger = new RunLedger(codes, 0);
    const req = listOf(ledger, 1, [1]);
    expect(ledger.close(req)).toEqual([1]);
    expect(ledger.requeue(1)).toBe('missing');
    expect(ledger.missing).toEqual([{ index: 1, code: 200, reason: 'no answer' }]);
    expect(ledger.close(req)).toBeNull(); // closed once only
  });
});
