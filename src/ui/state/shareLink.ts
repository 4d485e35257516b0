/**
 * The share link: the project, deflated ("deflate-raw") and base64url
 * encoded, in the URL hash as `#p=...`. Nothing leaves the browser; the link
 * carries the whole project: a plain one in the single-decoder form, as
 * links made before instruments, or an instrument with all its decoders.
 *
 * A link is capped as a file is: it may unpack to at most 1 MiB, and
 * unpacking stops there, so a small link that would inflate to hundreds of
 * megabytes costs no more than a 1 MiB one.
 */
import { LIMITS } from "../../core/project/limits.ts";
import { parseInstrument, type Instrument } from "../../core/project/instrument.ts";
import { fail, type Result } from "../../core/result/result.ts";

const PREFIX = "#p=";

/**
 * Longest link payload, base64url characters: a 1 MiB project deflated to
 * no more than itself plus deflate's stored-block overhead (5 bytes per
 * 16 KiB block, 1 KiB is ample), times 4/3.
 */
const MAX_PAYLOAD_CHARS = Math.ceil(((LIMITS.fileBytes + 1024) * 4) / 3);

async function pipe(bytes: Uint8Array, stream: CompressionStream | DecompressionStream): Promise<Uint8Array> {
  const out = new Blob([bytes as BlobPart]).stream().pipeThrough(stream);
  return new Uint8Array(await new Response(out).arrayBuffer());
}

/**
 * Inflates deflate-raw bytes, stopping as soon as the output passes
 * `maxBytes`. Returns null then; throws when the data is not deflate.
 */
export async function inflateCapped(bytes: Uint8Array, maxBytes: number): Promise<Uint8Array | null> {
  const reader = new Blob([bytes as BlobPart]).stream().pipeThrough(new DecompressionStream("deflate-raw")).getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => undefined);
      return null;
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** base64url without padding (RFC 4648 section 5). */
export function toBase64Url(bytes: Uint8Array): string {
  let bin = "";
  for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(bin).replace(/\+/g, "-").replace(/\//g, "_").replace(/=+$/, "");
}

export function fromBase64Url(text: string): Uint8Array | null {
  if (!/^[A-Za-z0-9_-]*$/.test(text)) return null;
  try {
    const bin = atob(text.replace(/-/g, "+").replace(/_/g, "/"));
    return Uint8Array.from(bin, (c) => c.charCodeAt(0));
  } catch {
    return null;
  }
}

/** The URL hash that carries a project's JSON text. */
export async function encodeShareHash(projectJson: string): Promise<string> {
  const packed = await pipe(new TextEncoder().encode(projectJson), new CompressionStream("deflate-raw"));
  return PREFIX + toBase64Url(packed);
}

/** True when a hash looks like a share link (it may still be broken). */
export function isShareHash(hash: string): boolean {
  return hash.startsWith(PREFIX);
}

const TOO_BIG = "the link holds more than 1 MiB when unpacked; a project needs far less";

/** Reads a project from a share hash, with the same validation and the same 1 MiB limit as a file. */
export async function decodeShareHash(hash: string): Promise<Result<Instrument>> {
  if (!isShareHash(hash)) return fail([{ path: "", message: "the link carries no project (#p=...)" }]);
  const payload = hash.slice(PREFIX.length);
  if (payload.length > MAX_PAYLOAD_CHARS) return fail([{ path: "", message: TOO_BIG }]);
  const bytes = fromBase64Url(payload);
  if (!bytes) return fail([{ path: "", message: "the link is damaged (not base64url); copy it again in full" }]);
  let text: string;
  try {
    const unpacked = await inflateCapped(bytes, LIMITS.fileBytes);
    if (!unpacked) return fail([{ path: "", message: TOO_BIG }]);
    text = new TextDecoder("utf-8", { fatal: true }).decode(unpacked);
  } catch {
    return fail([{ path: "", message: "the link is damaged (it does not unpack); copy it again in full" }]);
  }
  return parseInstrument(text);
}
