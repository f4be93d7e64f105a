// The two Web APIs the logbook hashing needs, present in Node 20 and every browser. Declared here
// rather than pulling the whole DOM library into a package that must stay free of I/O.
declare global {
  var crypto: { subtle: { digest(algorithm: 'SHA-256', data: Uint8Array): Promise<ArrayBuffer> } };
  class TextEncoder {
    encode(input: string): Uint8Array;
  }
}
export {};
