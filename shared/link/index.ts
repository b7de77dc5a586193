// Public API of the bench link codec and recorder.
export { CRC8_CATALOGUE, CRC8_NAMES, DEFAULT_CRC8, Crc8ConfigError, createCrc8, crc8, isCrc8Name } from './crc8';
export type { Crc8, Crc8Name, Crc8Params } from './crc8';
export { Kind, NakReason, SweepStatus, REPLY_KINDS, REQUEST_KINDS, ROTATION_REQUEST_KINDS, VECTOR_REQUEST_KINDS, isKnownKind, kindName } from './kinds';
export type { KindCode, NakReasonCode, SweepStatusCode } from './kinds';
export {
  DEFAULT_PROFILE,
  DEFAULT_VECTOR_PROFILE,
  INFO_FIXED_BYTES,
  MODE_INFO_FIXED_BYTES,
  VEC_GRID_BYTES,
  inputBytes,
  inputCodeRange,
  isInputCodeInRange,
  maxVectorListPairs,
  maxVectorResultPairs,
  validateVectorProfile,
  vectorPairBytes,
  vectorProfile,
  MAX_PAYLOAD,
  RESULTS_HEADER_BYTES,
  WireProfileError,
  angleBytes,
  angleCodeRange,
  isAngleCodeInRange,
  isPossibleLength,
  maxListCodes,
  maxResultPairs,
  outBytes,
  validateProfile,
} from './wire-profile';
export type { VectorWireProfile, WireProfile } from './wire-profile';
export { FRAME_OVERHEAD, FrameError, HEADER_BYTES, SYNC, encodeFrame, encodeFrameInto, frameLength } from './frame';
export { DecoderReentryError, FrameDecoder } from './decoder';
export type { AcceptedKinds, DecodedFrame, FrameDecoderOptions, SkipEvent, SkipReason } from './decoder';
export { ModeBit, PayloadError, decodePayload, encodeMessage, encodePayload, gridVector, profileFromInfo, sweepAngleCode, vectorWireProfile } from './payloads';
export type { DeviceInfo, Message, MessageOf, ModeInfo, VectorGrid, VectoringFormats } from './payloads';
export { ARCHIVE_MAGIC, ARCHIVE_VERSION, ArchiveError, ArchiveTruncatedError, readArchive } from './archive';
export type { Archive, ArchiveHeader, ArchiveRecord, Direction } from './archive';
export { RecordedDecoder, Recorder, replayArchive } from './recorder';
export type { RecordedDecoderOptions, RecorderOptions, ReplayResult } from './recorder';
