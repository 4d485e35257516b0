import { deflateRawSync } from "node:zlib";
import { afterEach, describe, expect, it } from "vitest";
import { decodeShareHash, encodeShareHash, fromBase64Url, toBase64Url } from "../../../../src/ui/state/shareLink.ts";
import { draftFromProject, draftToJson } from "../../../../src/ui/state/draft.ts";
import { addDecoder, instrumentToJson, plainInstrument, projectInstrumentDraft } from "../../../../src/ui/state/instrumentDraft.ts";
import { example, exampleText } from "../../../support/projects.ts";

describe("share link", () => {
  it("round-trips a project through the hash", async () => {
    const hash = await encodeShareHash(exampleText("turntable-position"));
    expect(hash.startsWith("#p=")).toBe(true);
    expect(hash).toMatch(/^#p=[A-Za-z0-9_-]+$/);
    const r = await decodeShareHash(hash);
    expect(r.ok && r.value).toEqual(plainInstrument(example("turntable-position")));
  });
  it("round-trips an instrument of two decoders, and a plain project's link keeps the form made before instruments", async () => {
    const plain = projectInstrumentDraft(example("turntable-position"));
    const two = addDecoder(plain, draftFromProject(example("die-roller")));
    const r = await decodeShareHash(await encodeShareHash(instrumentToJson(two)));
    expect(r.ok && r.value.decoders.map((d) => [d.name, d.project.counter.states])).toEqual([
      ["main", 12],
      ["decoder 2", 6],
    ]);
    expect(r.ok && r.value.single).toBe(false);
    expect(instrumentToJson(plain)).toBe(draftToJson(draftFromProject(example("turntable-position"))));
  });
  it("compresses: the hash is shorter than the JSON", async () => {
    const json = draftToJson(draftFromProject(example("relay-hex-monitor")));
    expect((await encodeShareHash(json)).length).toBeLessThan(json.length);
  });
  it("gives a clear problem for a damaged link", async () => {
    const bad = await decodeShareHash("#p=AAAA$$");
    expect(!bad.ok && bad.error[0]?.message).toMatch(/damaged/);
    const trunc = await decodeShareHash("#p=q1ZKzkxVsjI0MjA0");
    expect(trunc.ok).toBe(false);
    expect((await decodeShareHash("#other")).ok).toBe(false);
  });
  it("stops unpacking a link at 1 MiB, as a file is capped, however far it would inflate", async () => {
    // 64 MiB of zeros deflate to about 64 KiB: a small link that would take the page's memory and time.
    const bomb = "#p=" + toBase64Url(deflateRawSync(Buffer.alloc(64 * 1024 * 1024)));
    expect(bomb.length).toBeLessThan(100_000);
    const unpacked = countUnpackedBytes();
    const r = await decodeShareHash(bomb);
    expect(!r.ok && r.error[0]?.message).toBe("the link holds more than 1 MiB when unpacked; a project needs far less");
    // Unpacking stopped near the limit (a chunk or two past it), not after the whole 64 MiB.
    expect(unpacked()).toBeGreaterThan(1024 * 1024);
    expect(unpacked()).toBeLessThan(2 * 1024 * 1024);
  });
  it("refuses a link longer than any 1 MiB project packs to, without unpacking it", async () => {
    const unpacked = countUnpackedBytes();
    const r = await decodeShareHash("#p=" + "A".repeat(1_500_000));
    expect(!r.ok && r.error[0]?.message).toMatch(/more than 1 MiB/);
    expect(unpacked()).toBe(0);
  });
  it("base64url round-trips every byte value", () => {
    const bytes = Uint8Array.from({ length: 256 }, (_, i) => i);
    const text = toBase64Url(bytes);
    expect(text).not.toMatch(/[+/=]/);
    expect(fromBase64Url(text)).toEqual(bytes);
  });
});

const RealDecompressionStream = globalThis.DecompressionStream;
afterEach(() => {
  globalThis.DecompressionStream = RealDecompressionStream;
});

/** Wraps DecompressionStream to count the bytes it hands on; returns the counter. */
function countUnpackedBytes(): () => number {
  let bytes = 0;
  globalThis.DecompressionStream = class {
    readonly readable: ReadableStream<Uint8Array>;
    readonly writable: WritableStream<BufferSource>;
    constructor(format: CompressionFormat) {
      const real = new RealDecompressionStream(format);
      this.writable = real.writable;
      this.readable = real.readable.pipeThrough(
        new TransformStream<Uint8Array, Uint8Array>({
          transform(chunk, out) {
            bytes += chunk.byteLength;
            out.enqueue(chunk);
          },
        }),
      );
    }
  } as unknown as typeof DecompressionStream;
  return () => bytes;
}
