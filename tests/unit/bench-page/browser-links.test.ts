import { describe, expect, it } from 'vitest';
import { hostedBoardCore, hostedBoardUrl, hostedBoardUrlFor, serialSupport } from '../../../src/features/bench/transport/browser-links';

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

  it('addresses the hosted board of a core, and reads which core and baud an address names', () => {
    const here = { protocol: 'http:', host: '127.0.0.1:3000' };
    expect(hostedBoardUrlFor(here, 'phase-detector-16')).toBe('ws://127.0.0.1:3000/api/sim-board?core=phase-detector-16');
    expect(hostedBoardUrlFor(here, null)).toBe('ws://127.0.0.1:3000/api/sim-board');
    expect(hostedBoardCore('ws://127.0.0.1:3000/api/sim-board?core=phase-detector-16')).toEqual({ core: 'phase-detector-16', baud: null });
    expect(hostedBoardCore('wss://lab/api/sim-board?core=2&baud=921600')).toEqual({ core: '2', baud: 921_600 });
    expect(hostedBoardCore('ws://127.0.0.1:3000/api/sim-board?baud=fast')).toEqual({ core: null, baud: null });
    expect(hostedBoardCore('not an address')).toEqual({ core: null, baud: null });
  });
});
