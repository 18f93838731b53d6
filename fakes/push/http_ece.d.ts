// Types for http_ece 1.2.1 (the reference implementation of RFC 8188), which ships none; only what the fake
// push service and its tests call.
declare module 'http_ece' {
  import type { ECDH } from 'node:crypto';

  export interface EceParams {
    version?: 'aes128gcm' | 'aesgcm' | 'aesgcm128';
    /** The receiver's ECDH key (decrypt) or the sender's (encrypt). */
    privateKey?: ECDH;
    /** The other side's public key, base64url or raw; for aes128gcm decrypt it is read from the header. */
    dh?: string | Buffer;
    authSecret?: string | Buffer;
    key?: string | Buffer;
    keyid?: string | Buffer;
    salt?: string | Buffer;
    rs?: number;
  }

  export function decrypt(buffer: Buffer, params: EceParams): Buffer;
  export function encrypt(buffer: Buffer, params: EceParams): Buffer;
}
