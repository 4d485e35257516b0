import { describe, expect, it } from "vitest";
import { decodeShareHash, encodeShareHash, fromBase64Url, toBase64Url } from "../../../../src/ui/state/shareLink.ts";
import { draftFromProject, draftToJson } from "../../../../src/ui/state/draft.ts";
import { example, exampleText } from "../../../support/projects.ts";

describe("share link", () => {
  it("round-trips a project through the hash", async () => {
    const hash = await encodeShareHash(exampleText("turntable-position"));
    expect(hash.startsWith("#p=")).toBe(true);
    expect(hash).toMatch(/^#p=[A-Za-z0-9_-]+$/);
    const r = await decodeShareHash(hash);
    expect(r.ok && r.value).toEqual(example("turntable-position"));
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
  it("base64url round-trips every byte value", () => {
    const bytes = Uint8Array.from({ length: 256 }, (_, i) => i);
    const text = toBase64Url(bytes);
    expect(text).not.toMatch(/[+/=]/);
    expect(fromBase64Url(text)).toEqual(bytes);
  });
});
