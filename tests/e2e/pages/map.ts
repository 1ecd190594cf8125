import { expect, type Page } from "@playwright/test";
import sharp from "sharp";
import type { AuditDto } from "@/lib/api-types";
import { AuditApi } from "./audit";

/** An 8-bit sRGB colour and how far (per channel) a pixel may be from it to count. */
export interface ColourProbe {
  rgb: readonly [number, number, number];
  tolerance: number;
}

/** The palette's alarm red, the map's outline of plants out of tolerance (OUT_OF_TOLERANCE_RGB). */
export const HIGHLIGHT: ColourProbe = { rgb: [179, 54, 43], tolerance: 10 };
/** viridis at 0 (matplotlib), the colour of a cell with no plant out of tolerance. */
export const VIRIDIS_LOW: ColourProbe = { rgb: [68, 1, 84], tolerance: 12 };

/** Create an audit of the demo's Long Acre files through the API, as the brief's scripts would. */
export async function createDemoAudit(page: Page, profileName = "In-row weeding around plants"): Promise<AuditDto> {
  const api = new AuditApi(page);
  const fieldId = await api.fieldId("Long Acre");
  const planted = await api.upload(fieldId, "planted");
  const survey = await api.upload(fieldId, "survey");
  const profile = (await api.profiles()).find((p) => p.name === profileName);
  expect(profile, profileName).toBeTruthy();
  const res = await page.request.post("/api/audits?wait=1", {
    data: {
      fieldId,
      plantedDatasetId: planted.id,
      surveyDatasetId: survey.id,
      profileId: profile!.id,
      title: "Long Acre map check",
    },
  });
  expect(res.status(), await res.text()).toBe(201);
  const { audit } = (await res.json()) as { audit: AuditDto };
  expect(audit.state).toBe("computed");
  return audit;
}

/** /audits/:id/map and /fields/:id/map */
export class MapPage {
  constructor(private readonly page: Page) {}

  get root() {
    return this.page.getByTestId("field-map");
  }
  get status() {
    return this.page.getByTestId("map-status");
  }
  get details() {
    return this.page.getByTestId("map-details");
  }
  control(label: string) {
    return this.page.getByTestId("map-controls").getByLabel(label, { exact: true });
  }

  async openAudit(auditId: string) {
    const res = await this.page.goto(`/audits/${auditId}/map`);
    expect(res?.status()).toBe(200);
    await this.settled();
  }

  async openField(fieldId: string) {
    const res = await this.page.goto(`/fields/${fieldId}/map`);
    expect(res?.status()).toBe(200);
    await this.settled();
  }

  /** Wait until deck.gl has drawn the layers of the current settings (the map records what it drew last). */
  async settled() {
    await expect(this.root).toBeVisible({ timeout: 30_000 });
    await this.page.waitForFunction(
      () => {
        const el = document.querySelector<HTMLElement>('[data-testid="field-map"]');
        return !!el && Number(el.dataset.draws) > 0 && el.dataset.drawnKey === el.dataset.layersKey;
      },
      null,
      { timeout: 30_000 },
    );
    // One more frame so the screenshot shows the finished canvas.
    await this.page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  }

  async data(name: string): Promise<string | undefined> {
    return this.root.evaluate((el, key) => (el as HTMLElement).dataset[key], name);
  }

  /** The map canvas as raw RGBA pixels, read from a screenshot of its area. */
  async canvasPixels(): Promise<{ data: Buffer; width: number; height: number; channels: number }> {
    const box = await this.page.getByTestId("map-frame").locator("canvas").boundingBox();
    expect(box).not.toBeNull();
    const png = await this.page.screenshot({ clip: box! });
    const { data, info } = await sharp(png).raw().toBuffer({ resolveWithObject: true });
    return { data, width: info.width, height: info.height, channels: info.channels };
  }

  /** Number of canvas pixels within the probe's tolerance of its colour. */
  async countColour(probe: ColourProbe): Promise<number> {
    const { data, channels } = await this.canvasPixels();
    let n = 0;
    for (let i = 0; i < data.length; i += channels) {
      if (
        Math.abs(data[i] - probe.rgb[0]) <= probe.tolerance &&
        Math.abs(data[i + 1] - probe.rgb[1]) <= probe.tolerance &&
        Math.abs(data[i + 2] - probe.rgb[2]) <= probe.tolerance
      )
        n++;
    }
    return n;
  }

  async filter(label: string, option: string) {
    await this.control(label).selectOption({ label: option });
    await this.settled();
  }
}

/** How many pixels differ by more than `threshold` in any channel between two equally sized images. */
export function differingPixels(
  a: { data: Buffer; channels: number },
  b: { data: Buffer; channels: number },
  threshold = 24,
): number {
  let n = 0;
  for (let i = 0; i < Math.min(a.data.length, b.data.length); i += a.channels) {
    if (
      Math.abs(a.data[i] - b.data[i]) > threshold ||
      Math.abs(a.data[i + 1] - b.data[i + 1]) > threshold ||
      Math.abs(a.data[i + 2] - b.data[i + 2]) > threshold
    )
      n++;
  }
  return n;
}
