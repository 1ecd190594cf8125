import fs from "node:fs/promises";
import path from "node:path";
import { expect, type Download, type Page } from "@playwright/test";
import type { AuditDto, DatasetDto, ToleranceProfileDto, UploadOkDto } from "@/lib/api-types";

/** The demo files the technician uploads (public/demo/README.md). */
export const DEMO_FILES = {
  planted: { file: "public/demo/long-acre-as-planted.csv", crs: "EPSG:4326" },
  survey: { file: "public/demo/long-acre-survey.csv", crs: "EPSG:25831" },
} as const;

/** API calls a test makes in the signed-in page's session. */
export class AuditApi {
  constructor(private readonly page: Page) {}

  async fieldId(name: string): Promise<string> {
    const res = await this.page.request.get("/api/fields");
    expect(res.status()).toBe(200);
    const { fields } = (await res.json()) as { fields: { id: string; name: string }[] };
    const field = fields.find((f) => f.name === name);
    expect(field, `field ${name}`).toBeTruthy();
    return field!.id;
  }

  /** Upload a demo file without the upload screen (that screen has its own tests). */
  async upload(fieldId: string, kind: keyof typeof DEMO_FILES): Promise<DatasetDto> {
    const { file, crs } = DEMO_FILES[kind];
    const buffer = await fs.readFile(path.resolve(file));
    const res = await this.page.request.post(`/api/fields/${fieldId}/datasets`, {
      multipart: {
        file: { name: path.basename(file), mimeType: "text/csv", buffer },
        kind,
        crs,
        acceptWarnings: "true",
      },
    });
    expect(res.status(), await res.text()).toBe(201);
    return ((await res.json()) as UploadOkDto).dataset;
  }

  async audit(id: string): Promise<AuditDto> {
    const res = await this.page.request.get(`/api/audits/${id}`);
    expect(res.status()).toBe(200);
    return ((await res.json()) as { audit: AuditDto }).audit;
  }

  async profiles(): Promise<ToleranceProfileDto[]> {
    const res = await this.page.request.get("/api/profiles");
    expect(res.status()).toBe(200);
    return ((await res.json()) as { profiles: ToleranceProfileDto[] }).profiles;
  }
}

/** /fields/:id/audits/new */
export class NewAuditPage {
  constructor(private readonly page: Page) {}

  async open(fieldId: string) {
    await this.page.goto(`/fields/${fieldId}/audits/new`);
    await expect(this.page.getByTestId("new-audit-form")).toBeVisible();
  }

  async fill(o: {
    title: string;
    plantedId: string;
    surveyId: string;
    profileName: string;
    match: RegExp;
    maxDistanceMm: string;
  }) {
    const p = this.page;
    await p.getByLabel("Title").fill(o.title);
    // Options appear once the datasets and profiles have loaded.
    await expect(p.locator(`#plantedDatasetId option[value="${o.plantedId}"]`)).toHaveCount(1);
    await p.getByLabel("As-planted records").selectOption(o.plantedId);
    await expect(p.locator(`#surveyDatasetId option[value="${o.surveyId}"]`)).toHaveCount(1);
    await p.getByLabel("Survey of checkpoints").selectOption(o.surveyId);
    const option = p.locator("#profileId option", { hasText: o.profileName });
    await expect(option).toHaveCount(1);
    await p.getByLabel("Tolerance profile").selectOption((await option.getAttribute("value"))!);
    await expect(p.getByTestId("profile-limits")).toBeVisible();
    await p.getByRole("radio", { name: o.match }).check();
    await p.getByLabel("Maximum pairing distance").fill(o.maxDistanceMm);
  }

  async submit() {
    await this.page.getByRole("button", { name: "Run the audit" }).click();
  }
}

/** /audits/:id */
export class AuditResultPage {
  constructor(private readonly page: Page) {}

  get verdict() {
    return this.page.getByTestId("verdict");
  }
  get criteria() {
    return this.page.getByTestId("criterion");
  }
  get residualRows() {
    return this.page.getByTestId("residual-row");
  }
  get residualStatus() {
    return this.page.getByTestId("residuals-status");
  }

  auditIdFromUrl(): string {
    const m = /\/audits\/([0-9a-f-]{36})$/.exec(new URL(this.page.url()).pathname);
    expect(m, `audit id in ${this.page.url()}`).toBeTruthy();
    return m![1];
  }

  async waitUntilComputed() {
    await expect(this.page.getByTestId("audit-result")).toHaveAttribute("data-state", "computed", { timeout: 60_000 });
  }

  /** Click a sortable heading and wait until the server's answer for that sort is on screen. */
  async sortResidualsBy(header: string, sortKey: string) {
    const answered = this.page.waitForResponse(
      (r) => r.url().includes("/residuals?") && new URL(r.url()).searchParams.get("sort") === sortKey,
    );
    await this.page.getByTestId("residuals-table").getByRole("button", { name: header }).click();
    await answered;
    await expect(this.page.getByTestId("residuals-table")).toHaveAttribute("aria-busy", "false");
  }

  /** Change one filter control and wait until the server's answer for it is on screen. */
  async filter(
    label: "Show" | "Tool arm" | "Bed" | "GNSS fix" | "Planting day" | "Plant id contains",
    value: string,
    param: string,
    expected: string,
  ) {
    const answered = this.page.waitForResponse(
      (r) => r.url().includes("/residuals?") && new URL(r.url()).searchParams.get(param) === expected,
    );
    const control = this.page.getByTestId("residuals").getByLabel(label, { exact: true });
    if (label === "Plant id contains") await control.fill(value);
    else await control.selectOption({ label: value });
    await answered;
    await expect(this.page.getByTestId("residuals-table")).toHaveAttribute("aria-busy", "false");
  }

  async clearFilters() {
    await this.page.getByRole("button", { name: "Clear filters" }).click();
    await expect(this.page.getByTestId("residuals-table")).toHaveAttribute("aria-busy", "false");
  }

  /** Radial errors (m) and beds of the rows on the current page of the residuals table. */
  async residualRowsData(): Promise<{ radial: number; bed: string; plant: string }[]> {
    return this.residualRows.evaluateAll((rows) =>
      rows.map((r) => ({
        radial: Number((r as HTMLElement).dataset.radial),
        bed: (r as HTMLElement).dataset.bed ?? "",
        plant: (r as HTMLElement).dataset.plant ?? "",
      })),
    );
  }

  /** Clicks a download link in the spreadsheet downloads ("downloads") or the reports as computed. */
  async download(
    linkName: string | RegExp,
    where: "downloads" | "downloads-as-computed" = "downloads",
  ): Promise<{ download: Download; text: string }> {
    const [download] = await Promise.all([
      this.page.waitForEvent("download"),
      this.page.getByTestId(where).getByRole("link", { name: linkName }).click(),
    ]);
    expect(await download.failure()).toBeNull();
    const text = await fs.readFile((await download.path())!, "utf8");
    return { download, text };
  }
}

/** /profiles */
export class ProfilesPage {
  constructor(private readonly page: Page) {}
  async open() {
    await this.page.goto("/profiles");
    await expect(this.page.getByTestId("profiles-table")).toBeVisible();
  }
  row(name: string) {
    return this.page.locator(`[data-testid="profile-row"][data-profile-name="${name}"]`);
  }
  editButton(name: string) {
    return this.page.getByRole("button", { name: `Edit ${name}` });
  }
  async edit(
    name: string,
    changes: Partial<Record<"Name" | "Radial limit" | "Cross-row limit" | "Along-row limit", string>>,
  ) {
    await this.editButton(name).click();
    const form = this.page.getByTestId("profile-form");
    await expect(form).toBeVisible();
    for (const [label, value] of Object.entries(changes)) await form.getByLabel(label, { exact: true }).fill(value!);
    await form.getByRole("button", { name: "Save profile" }).click();
  }
}

/** Millimetres as the result page prints them ("4.1 mm"); written out here because the test runner cannot load app components. */
export function formatMm(metres: number | null | undefined): string {
  if (metres === null || metres === undefined || !Number.isFinite(metres)) return "–";
  return `${(metres * 1000).toFixed(1)} mm`;
}

/** A small RFC 4180 reader: quoted fields, doubled quotes, CRLF or LF. */
export function parseCsv(text: string): Record<string, string>[] {
  const rows: string[][] = [];
  let row: string[] = [],
    cell = "",
    quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ",") {
      row.push(cell);
      cell = "";
    } else if (c === "\n" || c === "\r") {
      if (c === "\r" && text[i + 1] === "\n") i++;
      row.push(cell);
      rows.push(row);
      row = [];
      cell = "";
    } else cell += c;
  }
  if (cell !== "" || row.length) {
    row.push(cell);
    rows.push(row);
  }
  const [header, ...body] = rows.filter((r) => r.length > 1 || r[0] !== "");
  return body.map((r) => Object.fromEntries(header.map((h, i) => [h, r[i] ?? ""])));
}
