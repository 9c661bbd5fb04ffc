// Globals present in every runtime Planktide's shared code runs in (Node 20, browsers, web workers),
// declared here because shared/ is type-checked with neither the DOM nor the Node library.
declare class TextEncoder {
  encode(input?: string): Uint8Array;
}
declare class TextDecoder {
  constructor(label?: string);
  decode(input?: Uint8Array): string;
}
