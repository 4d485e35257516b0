/**
 * The share link: the project, deflated ("deflate-raw") and base64url
 * encoded, in the URL hash as `#p=...`. Nothing leaves the browser; the link
 * carries the whole project.
 */
import { parseProject } from "../../core/project/projectSchema.ts";
import type { Project } from "../../core/project/project.ts";
import { fail, type Result } from "../../core/result/result.ts";

const PREFIX = "#p=";

async function pipe(bytes: Uint8Array, stream: CompressionStream | DecompressionStream): Promise<Uint8Array> {
  const out = new Blob([bytes as BlobPart]).stream().pipeThrough(stream);
  return new Uint8Array(await new Response(out).arrayBuffer());
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

/** Reads a project from a share hash, with the same validation as a file. */
export async function decodeShareHash(hash: string): Promise<Result<Project>> {
  if (!isShareHash(hash)) return fail([{ path: "", message: "the link carries no project (#p=...)" }]);
  const bytes = fromBase64Url(hash.slice(PREFIX.length));
  if (!bytes) return fail([{ path: "", message: "the link is damaged (not base64url); copy it again in full" }]);
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(await pipe(bytes, new DecompressionStream("deflate-raw")));
  } catch {
    return fail([{ path: "", message: "the link is damaged (it does not unpack); copy it again in full" }]);
  }
  return parseProject(text);
}
