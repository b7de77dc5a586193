// Angle and output number formats of the bench link (docs/protocol.md "3. Numbers"). Plain arithmetic
// throughout: codes reach 32 bits and JavaScript's bit operators would wrap them.
import { AngleCodeError, OutputCodeError } from './errors';
import type { ModelConfig } from './model-config';

/** How an angle code is read: `turn` (unsigned binary angle) or `rad` (signed fixed-point radians). */
export type AngleFormat = Pick<ModelConfig, 'angleFormat' | 'angleBits' | 'angleFrac'>;
/** How an output code is read: signed two's complement, `outBits` total, `outFrac` fraction bits. */
export type OutputFormat = Pick<ModelConfig, 'outBits' | 'outFrac'>;

/** Inclusive range of integer codes and how many there are. */
export interface CodeRange {
  min: number;
  max: number;
  count: number;
}

const TWO_PI = 2 * Math.PI;

/** Rounds half away from zero, the rounding the model definition uses everywhere. */
export function roundHalfAwayFromZero(v: number): number {
  return v < 0 ? -Math.round(-v) : Math.round(v);
}

/** Bytes a field of `bits` bits takes on the wire: ceil(bits / 8). */
export function fieldBytes(bits: number): number {
  return Math.ceil(bits / 8);
}

/** Reads the low `bits` bits of `raw` (an unsigned field) as two's complement. */
export function signExtend(raw: number, bits: number): number {
  const span = 2 ** bits;
  const v = ((raw % span) + span) % span;
  return v >= span / 2 ? v - span : v;
}

/** The unsigned `bits`-bit pattern of a signed code (the inverse of signExtend). */
export function toTwosComplement(code: number, bits: number): number {
  const span = 2 ** bits;
  return ((code % span) + span) % span;
}

/** The codes an angle format can hold: 0..2^N−1 for `turn`, −2^(N−1)..2^(N−1)−1 for `rad`. */
export function angleCodeRange(f: AngleFormat): CodeRange {
  const count = 2 ** f.angleBits;
  return f.angleFormat === 'turn' ? { min: 0, max: count - 1, count } : { min: -count / 2, max: count / 2 - 1, count };
}

/** True when `code` is an integer the angle format can hold. */
export function isAngleCode(f: AngleFormat, code: number): boolean {
  const r = angleCodeRange(f);
  return Number.isInteger(code) && code >= r.min && code <= r.max;
}

/** @throws AngleCodeError when `code` is not an integer the angle format can hold. */
export function assertAngleCode(f: AngleFormat, code: number): void {
  if (!isAngleCode(f, code)) {
    const r = angleCodeRange(f);
    throw new AngleCodeError(`angle code ${code} is not an integer ${r.min}..${r.max} (${f.angleFormat}, ${f.angleBits} bits)`);
  }
}

/**
 * Brings any integer into the format as the device does for SWEEP codes: wrapped modulo 2^N for
 * `turn`, saturated to the range for `rad`.
 */
export function wrapOrSaturateAngleCode(f: AngleFormat, code: number): number {
  const r = angleCodeRange(f);
  if (f.angleFormat === 'turn') return ((code % r.count) + r.count) % r.count;
  return Math.min(r.max, Math.max(r.min, code));
}

/** The angle a code stands for, in turns: [0, 1) for `turn`, code / 2^angleFrac / 2π for `rad`. */
export function angleCodeToTurns(f: AngleFormat, code: number): number {
  assertAngleCode(f, code);
  return f.angleFormat === 'turn' ? code / 2 ** f.angleBits : code / 2 ** f.angleFrac / TWO_PI;
}

/** The angle a code stands for, in radians. */
export function angleCodeToRadians(f: AngleFormat, code: number): number {
  assertAngleCode(f, code);
  return f.angleFormat === 'turn' ? (TWO_PI * code) / 2 ** f.angleBits : code / 2 ** f.angleFrac;
}

/** The angle a code stands for, in degrees. */
export function angleCodeToDegrees(f: AngleFormat, code: number): number {
  assertAngleCode(f, code);
  return f.angleFormat === 'turn' ? (360 * code) / 2 ** f.angleBits : ((code / 2 ** f.angleFrac) * 180) / Math.PI;
}

function radCode(f: AngleFormat, radians: number, what: string): number {
  const code = roundHalfAwayFromZero(radians * 2 ** f.angleFrac);
  const r = angleCodeRange(f);
  if (!Number.isFinite(code) || code < r.min || code > r.max) {
    const lo = r.min / 2 ** f.angleFrac;
    const hi = r.max / 2 ** f.angleFrac;
    throw new AngleCodeError(`${what} is outside the rad format's range [${lo}, ${hi}] rad`);
  }
  return code;
}

function turnCode(f: AngleFormat, turns: number, what: string): number {
  if (!Number.isFinite(turns)) throw new AngleCodeError(`${what} is not a finite angle`);
  // Reduce first so the product stays exact for large angles; binary angles wrap by design.
  const frac = turns - Math.floor(turns);
  return wrapOrSaturateAngleCode(f, roundHalfAwayFromZero(frac * 2 ** f.angleBits));
}

/** The nearest code to an angle in turns (wraps for `turn`; out of range throws for `rad`). */
export function turnsToAngleCode(f: AngleFormat, turns: number): number {
  return f.angleFormat === 'turn' ? turnCode(f, turns, `${turns} turn`) : radCode(f, turns * TWO_PI, `${turns} turn`);
}

/** The nearest code to an angle in radians (wraps for `turn`; out of range throws for `rad`). */
export function radiansToAngleCode(f: AngleFormat, radians: number): number {
  return f.angleFormat === 'turn' ? turnCode(f, radians / TWO_PI, `${radians} rad`) : radCode(f, radians, `${radians} rad`);
}

/** The nearest code to an angle in degrees (wraps for `turn`; out of range throws for `rad`). */
export function degreesToAngleCode(f: AngleFormat, degrees: number): number {
  return f.angleFormat === 'turn'
    ? turnCode(f, degrees / 360, `${degrees}°`)
    : radCode(f, (degrees * Math.PI) / 180, `${degrees}°`);
}

/** The codes an output format can hold: −2^(outBits−1)..2^(outBits−1)−1. */
export function outputCodeRange(f: OutputFormat): CodeRange {
  const count = 2 ** f.outBits;
  return { min: -count / 2, max: count / 2 - 1, count };
}

/** One LSB of the output format in output units: 2^−outFrac. */
export function outputLsb(f: OutputFormat): number {
  return 2 ** -f.outFrac;
}

/** @throws OutputCodeError when `code` is not an integer the output format can hold. */
export function assertOutputCode(f: OutputFormat, code: number): void {
  const r = outputCodeRange(f);
  if (!Number.isInteger(code) || code < r.min || code > r.max) {
    throw new OutputCodeError(`output code ${code} is not an integer ${r.min}..${r.max} (${f.outBits} bits)`);
  }
}

/** The value an output code stands for: code · 2^−outFrac. */
export function outputCodeToValue(f: OutputFormat, code: number): number {
  assertOutputCode(f, code);
  return code / 2 ** f.outFrac;
}

/** Clamps an integer to the output range, as the model's output stage does. */
export function saturateOutputCode(f: OutputFormat, code: number): number {
  const r = outputCodeRange(f);
  return Math.min(r.max, Math.max(r.min, code));
}

/**
 * The nearest output code to a value (round half away from zero).
 * @throws OutputCodeError when the value lies outside the format; use saturateOutputCode to clamp.
 */
export function valueToOutputCode(f: OutputFormat, value: number): number {
  const code = roundHalfAwayFromZero(value * 2 ** f.outFrac);
  const r = outputCodeRange(f);
  if (!Number.isFinite(code) || code < r.min || code > r.max) {
    throw new OutputCodeError(`${value} is outside the output format's range [${r.min / 2 ** f.outFrac}, ${r.max / 2 ** f.outFrac}]`);
  }
  return code;
}
