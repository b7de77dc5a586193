import { describe, expect, it } from 'vitest';
import { captureLabelText } from '../../../src/features/sessions/capture/capture-label';

describe('the capture label in words', () => {
  it('reads a Bench page label', () => {
    const label = JSON.stringify({ recordedBy: 'anglebench bench', transport: 'Simulated board ws://127.0.0.1:5175/', baud: 3_000_000, openedAt: '2026-12-02T05:32:43.763Z' });
    expect(captureLabelText(label)).toBe('recorded on the Bench page, over Simulated board ws://127.0.0.1:5175/, at 3,000,000 baud, connected 2026-12-02 05:32 UTC');
  });

  it('reads a runner label', () => {
    const label = JSON.stringify({ recordedBy: 'anglebench run', core: 'reference-16', build: 'ref16-r3', board: null, plan: { kind: 'exhaustive' }, model: {} });
    expect(captureLabelText(label)).toBe('recorded by the runner, for core reference-16, build ref16-r3, plan exhaustive');
  });

  it('quotes any other label as written, JSON or not', () => {
    expect(captureLabelText('probe')).toBe('“probe”');
    expect(captureLabelText('{"a":1}')).toBe('“{"a":1}”');
    expect(captureLabelText('[1,2]')).toBe('“[1,2]”');
  });
});
