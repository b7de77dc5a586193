/** Baud rates offered in the connect form; any other rate from 9,600 to 12,000,000 may be typed. */
export const COMMON_BAUD_RATES = [
  9_600, 19_200, 38_400, 57_600, 115_200, 230_400, 460_800, 921_600, 1_000_000, 2_000_000, 3_000_000,
  4_000_000, 6_000_000, 12_000_000,
] as const;

export const MIN_BAUD = 9_600;
export const MAX_BAUD = 12_000_000;

/**
 * A receive buffer holding at least 20 ms of traffic at the line rate, as a power of two.
 * The Web Serial default of 255 bytes lasts 0.85 ms at 3 Mbaud and overruns (WICG Web Serial
 * issue #164); 8N1 carries baud/10 bytes per second (common practice, no source).
 */
export function recommendedBufferSize(baud: number): number {
  const bytes = Math.ceil((baud / 10) * 0.02);
  return Math.max(256, 2 ** Math.ceil(Math.log2(bytes)));
}

export interface SerialSettings {
  baudRate: number;
  dataBits: 7 | 8;
  stopBits: 1 | 2;
  parity: 'none' | 'even' | 'odd';
  flowControl: 'none' | 'hardware';
  bufferSize: number;
  dataTerminalReady: boolean;
  requestToSend: boolean;
}

/** The bench link's defaults: 3,000,000 baud 8N1, no flow control. */
export const defaultSerialSettings = (): SerialSettings => ({
  baudRate: 3_000_000,
  dataBits: 8,
  stopBits: 1,
  parity: 'none',
  flowControl: 'none',
  bufferSize: recommendedBufferSize(3_000_000),
  dataTerminalReady: true,
  requestToSend: false,
});
