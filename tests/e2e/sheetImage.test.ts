/**
 * Renders two matrix sheets in the real browser (Chromium through
 * playwright-core) and compares the pixels with committed reference images
 * in tests/e2e/reference-images/. The PNGs are decoded by Chromium itself, on
 * a canvas, so no image package is needed.
 *
 * The matrices are fixed (the direct hex monitor, and the die roller with
 * hand-built buses and a link), so the images do not move when the optimizer
 * improves. To accept a deliberate change of the drawing, look at the new
 * images, then run with UPDATE_REFERENCE_IMAGES=1 and commit them.
 */
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import type { Browser } from "playwright-core";
import { launchChromium } from "../support/chromium.ts";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { drawingOptions } from "../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../src/render/layout.ts";
import { registerNodeWindow } from "../../src/render/nodeWindow.ts";
import { sheetSvgText } from "../../src/render/sheetSvg.ts";
import { dieRollerShared, directExample } from "../support/sharedMatrix.ts";

/** Pixels per millimetre of the rendered images (about 100 dpi). */
const PX_PER_MM = 4;
/** A pixel differs when some channel differs by more than this (0-255). */
const CHANNEL_TOLERANCE = 64;
/** Largest share of differing pixels accepted (anti-aliasing, font hinting). */
const MAX_DIFFERING = 0.004;

const REFERENCE_DIR = new URL("./reference-images/", import.meta.url);
const update = process.env["UPDATE_REFERENCE_IMAGES"] === "1";

let browser: Browser;

beforeAll(async () => {
  registerNodeWindow();
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
});

async function renderPng(svg: string, widthMm: number, heightMm: number): Promise<{ png: Buffer; parseError: string | null }> {
  const width = Math.round(widthMm * PX_PER_MM);
  const height = Math.round(heightMm * PX_PER_MM);
  const page = await browser.newPage({ viewport: { width, height }, deviceScaleFactor: 1 });
  try {
    const src = `data:image/svg+xml;base64,${Buffer.from(svg).toString("base64")}`;
    await page.setContent(
      `<!DOCTYPE html><html><body style="margin:0;background:#fff"><img id="sheet" style="display:block;width:${width}px;height:${height}px" src="${src}"></body></html>`,
    );
    await page.waitForFunction(() => (document.getElementById("sheet") as HTMLImageElement).complete);
    const parseError = await page.evaluate((text) => {
      const doc = new DOMParser().parseFromString(text, "image/svg+xml");
      return doc.getElementsByTagName("parsererror")[0]?.textContent ?? null;
    }, svg);
    return { png: await page.screenshot({ type: "png" }), parseError };
  } finally {
    await page.close();
  }
}

/** Share of pixels that differ between two PNGs, decoded by Chromium; 1 when the sizes differ. */
async function differingShare(a: Buffer, b: Buffer): Promise<number> {
  const page = await browser.newPage();
  try {
    return await page.evaluate(
      async ({ a, b, tolerance }) => {
        const load = async (data: string): Promise<ImageData> => {
          const img = new Image();
          img.src = `data:image/png;base64,${data}`;
          await img.decode();
          const canvas = document.createElement("canvas");
          canvas.width = img.naturalWidth;
          canvas.height = img.naturalHeight;
          const ctx = canvas.getContext("2d") as CanvasRenderingContext2D;
          ctx.drawImage(img, 0, 0);
          return ctx.getImageData(0, 0, canvas.width, canvas.height);
        };
        const [p, q] = [await load(a), await load(b)];
        if (p.width !== q.width || p.height !== q.height) return 1;
        let differing = 0;
        for (let i = 0; i < p.data.length; i += 4) {
          for (let c = 0; c < 3; c++) {
            if (Math.abs((p.data[i + c] as number) - (q.data[i + c] as number)) > tolerance) {
              differing++;
              break;
            }
          }
        }
        return differing / (p.width * p.height);
      },
      { a: a.toString("base64"), b: b.toString("base64"), tolerance: CHANNEL_TOLERANCE },
    );
  } finally {
    await page.close();
  }
}

const cases = {
  "hex-monitor-direct": () => directExample("relay-hex-monitor"),
  "die-roller-shared": dieRollerShared,
};

describe("matrix sheets rendered in Chromium", () => {
  for (const [name, make] of Object.entries(cases)) {
    it(`${name} matches its reference image`, async () => {
      const { project, spec, matrix } = make();
      const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project, { date: "2026-12-01" }));
      const sheet = drawing.sheets[0]!;
      const { png, parseError } = await renderPng(sheetSvgText(sheet), sheet.widthMm, sheet.heightMm);
      expect(parseError).toBeNull();
      const file = new URL(`${name}.png`, REFERENCE_DIR);
      if (update) writeFileSync(file, png);
      expect(existsSync(file), `no reference image ${name}.png; render one with UPDATE_REFERENCE_IMAGES=1 and look at it`).toBe(true);
      const share = await differingShare(png, readFileSync(file));
      expect(share).toBeLessThanOrEqual(MAX_DIFFERING);
    });
  }

  it("the comparison notices a wrong drawing", async () => {
    const a = directExample("relay-hex-monitor");
    const b = directExample("turntable-position");
    const sa = layoutMatrix(a.project, a.spec, a.matrix, drawingOptions(a.project)).sheets[0]!;
    const sb = layoutMatrix(b.project, b.spec, b.matrix, drawingOptions(b.project)).sheets[0]!;
    const [pa, pb] = [
      await renderPng(sheetSvgText(sa), sa.widthMm, sa.heightMm),
      await renderPng(sheetSvgText(sb), sb.widthMm, sb.heightMm),
    ];
    expect(await differingShare(pa.png, pb.png)).toBeGreaterThan(MAX_DIFFERING);
  });
});
