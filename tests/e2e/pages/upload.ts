import { expect, type Locator, type Page } from "@playwright/test";

/** The create / edit field form as a page object. */
export class FieldFormPage {
  constructor(private readonly page: Page) {}

  async openNew() {
    await this.page.goto("/fields/new");
    await expect(this.page.getByRole("heading", { level: 1 })).toHaveText("New field");
  }

  get name() {
    return this.page.getByLabel("Field name");
  }
  get farm() {
    return this.page.getByLabel("Farm or site");
  }
  get crs() {
    return this.page.getByRole("combobox", { name: "Coordinate system (CRS)" });
  }
  get timeZone() {
    return this.page.getByLabel("Time zone");
  }
  get rowBearing() {
    return this.page.getByLabel("Row bearing (° from grid north)");
  }
  get bedSpacing() {
    return this.page.getByLabel("Bed spacing (m)");
  }
  get rowsPerBed() {
    return this.page.getByLabel("Rows per bed");
  }
  get rowSpacing() {
    return this.page.getByLabel("Row spacing (m)");
  }

  /** Types `search` into the CRS box and picks `code` from the list of matches. */
  async chooseCrs(search: string, code: string) {
    await this.crs.fill(search);
    const option = this.page.getByRole("option", { name: new RegExp(`^${code.replace(":", "\\:")} `) });
    await option.click();
    await expect(this.crs).toHaveValue(code);
  }

  async boundaryFromFile(file: { name: string; mimeType: string; buffer: Buffer }) {
    await this.page.getByLabel("From a GeoJSON file (WGS 84 longitude/latitude)").check();
    await this.page.getByLabel("Boundary file (.geojson or .json)").setInputFiles(file);
  }

  fieldError(id: string): Locator {
    return this.page.locator(`[data-field-error="${id}"]`);
  }

  async submit(label = "Create field") {
    await this.page.getByRole("button", { name: label }).click();
  }
}

/** The upload page of one field as a page object. */
export class UploadPage {
  constructor(private readonly page: Page) {}

  async open(fieldId: string, kind: "planted" | "survey") {
    await this.page.goto(`/fields/${fieldId}/upload?kind=${kind}`);
    await expect(this.page.getByRole("heading", { level: 1 })).toHaveText(
      kind === "planted" ? "Upload as-planted records" : "Upload survey checkpoints",
    );
  }

  get fileInput() {
    return this.page.getByLabel("Choose a file or drop it here");
  }
  get previewTable() {
    return this.page.getByTestId("preview-table");
  }
  get transferBar() {
    return this.page.getByRole("progressbar", { name: "Sending the file" });
  }
  get serverBar() {
    return this.page.getByTestId("upload-server");
  }
  get saved() {
    return this.page.getByTestId("upload-saved");
  }
  get invalid() {
    return this.page.getByTestId("upload-invalid");
  }
  get warnings() {
    return this.page.getByTestId("upload-warnings");
  }
  get errorTable() {
    return this.page.getByTestId("error-table");
  }

  async choose(file: string | { name: string; mimeType: string; buffer: Buffer }) {
    await this.fileInput.setInputFiles(file);
    await expect(this.previewTable).toBeVisible();
  }

  /** Opens the file picker from the keyboard (focus, then Enter) and chooses the file there. */
  async chooseWithKeyboard(file: string | { name: string; mimeType: string; buffer: Buffer }) {
    await this.fileInput.focus();
    const [chooser] = await Promise.all([this.page.waitForEvent("filechooser"), this.page.keyboard.press("Enter")]);
    await chooser.setFiles(file);
    await expect(this.previewTable).toBeVisible();
  }

  /** The select of one column role, by its label (e.g. "Latitude", "Stated precision (m)"). */
  role(label: string): Locator {
    return this.page.getByTestId("mapping-form").getByLabel(label, { exact: true });
  }

  async save() {
    await this.page.getByRole("button", { name: "Check and save the file" }).click();
  }

  async acceptWarningsAndSave() {
    await expect(this.warnings).toBeVisible();
    await this.page.getByLabel("I have read these warnings and want to save the file anyway").check();
    await this.page.getByRole("button", { name: "Save with these warnings" }).click();
  }

  /** Both bars at 100 %: the file is sent and the server has read, checked and saved it. */
  async expectComplete() {
    await expect(this.transferBar).toHaveAttribute("aria-valuenow", "100");
    await expect(this.serverBar).toHaveAttribute("aria-valuenow", "100");
  }
}
