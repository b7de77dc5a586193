// UTF-8 for the archive's text fields. The WHATWG Encoding API is in every runtime Anglebench
// runs on (browsers, Node), but shared/ compiles without DOM or Node types, so the two classes
// are declared here, in this module's scope only.
interface Utf8Encoder {
  encode(text: string): Uint8Array;
}
interface Utf8Decoder {
  decode(bytes: Uint8Array): string;
}
declare const TextEncoder: new () => Utf8Encoder;
declare const TextDecoder: new () => Utf8Decoder;

export function encodeUtf8(text: string): Uint8Array {
  return new TextEncoder().encode(text);
}

/** Ill-formed sequences read as U+FFFD, as the Encoding API does by default. */
export function decodeUtf8(bytes: Uint8Array): string {
  return new TextDecoder().decode(bytes);
}
