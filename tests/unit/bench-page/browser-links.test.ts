import { describe, expect, it } from 'vitest';
import { hostedBoardUrl, serialSupport } from '../../../src/features/bench/transport/browser-links';

describe('what the Bench page can connect through', () => {
  it('offers the serial port only in a secure context with Web Serial, and says why not otherwise', () => {
    expect(serialSupport({ secureContext: true, hasSerial: true })).toEqual({ available: true });
    const plainHttp = serialSupport({ secureContext: false, hasSerial: false });
    expect(plainHttp.available).toBe(false);
    expect(!plainHttp.available && plainHttp.reason).toMatch(/plain http.*https:\/\/ address.*station/);
    const noSerial = serialSupport({ secureContext: true, hasSerial: false });
    expect(!noSerial.available && noSerial.reason).toMatch(/no Web Serial.*Chromium-based.*station/);
  });

  it('finds the hosted simulated board on the page’s own server, wss: under HTTPS', () => {
    expect(hostedBoardUrl({ protocol: 'https:', host: 'lab-server:3000' })).toBe('wss://lab-server:3000/api/sim-board');
    expect(hostedBoardUrl({ protocol: 'http:', host: '127.0.0.1:3000' })).toBe('ws://127.0.0.1:3000/api/sim-board');
  });
});
