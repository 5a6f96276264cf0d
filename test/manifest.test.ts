/**
 * The add-in manifest, checked offline (the platform's validator needs a network service).
 * Rules come from the host platform's manifest documentation (XML add-in manifest, shared runtime,
 * custom functions extension point); every URL must name a file the build emits.
 */
import * as fs from "node:fs";
import * as path from "node:path";
import { XMLParser, XMLValidator } from "fast-xml-parser";
import { validateXML } from "xmllint-wasm";

const root = path.resolve(__dirname, "..");
const xml = fs.readFileSync(path.join(root, "manifest.xml"), "utf8");
const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: "@", removeNSPrefix: true, isArray: (name) => ["Set", "Url", "Image", "String", "Runtime", "Host"].includes(name) });
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const doc: any = parser.parse(xml);
const app = doc.OfficeApp;
const overrides = app.VersionOverrides;
const host = overrides.Hosts.Host[0];
const res = overrides.Resources;

function resource(kind: "Urls" | "Images" | "ShortStrings" | "LongStrings", id: string): string {
  const list: Array<Record<string, string>> = kind === "Urls" ? res.Urls.Url : kind === "Images" ? res.Images.Image : res[kind].String;
  const hit = list.find((e) => e["@id"] === id);
  if (!hit) throw new Error(`resid ${id} is not defined in Resources/${kind}`);
  return hit["@DefaultValue"];
}

function pngSize(file: string): [number, number] {
  const b = fs.readFileSync(file);
  expect(b.subarray(1, 4).toString()).toBe("PNG");
  return [b.readUInt32BE(16), b.readUInt32BE(20)];
}

describe("manifest.xml", () => {
  test("is well-formed XML", () => {
    expect(XMLValidator.validate(xml)).toBe(true);
  });

  test("has a GUID id, a version, the Workbook host and only ReadWriteDocument permission", () => {
    expect(app.Id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i);
    expect(app.Version).toMatch(/^\d+\.\d+\.\d+\.\d+$/);
    expect(app.Hosts.Host.map((h: Record<string, string>) => h["@Name"])).toEqual(["Workbook"]);
    expect(app.Permissions).toBe("ReadWriteDocument");
    // AppDomains may not be empty (https://learn.microsoft.com/en-us/javascript/api/manifest/appdomains: "must
    // contain at least one AppDomain"); every page is on the SourceLocation origin, so the element is left out.
    expect(app.AppDomains).toBeUndefined();
  });

  test("asks for the shared runtime and custom functions requirement sets", () => {
    const sets = app.Requirements.Sets.Set.map((s: Record<string, string>) => [s["@Name"], s["@MinVersion"]]);
    expect(sets).toEqual(expect.arrayContaining([["SharedRuntime", "1.1"], ["CustomFunctionsRuntime", "1.2"]]));
  });

  test("one long-lived runtime whose page is also the custom functions page and the function file", () => {
    const runtimes = host.Runtimes.Runtime;
    expect(runtimes).toHaveLength(1);
    expect(runtimes[0]["@lifetime"]).toBe("long");
    const rid = runtimes[0]["@resid"];
    const cf = host.AllFormFactors.ExtensionPoint;
    expect(cf["@type"]).toBe("CustomFunctions");
    expect(cf.Page.SourceLocation["@resid"]).toBe(rid);
    expect(host.DesktopFormFactor.FunctionFile["@resid"]).toBe(rid);
    expect(resource("Urls", rid)).toBe(app.DefaultSettings.SourceLocation["@DefaultValue"]);
  });

  test("custom functions: namespace ASKEW, script and metadata resources", () => {
    const cf = host.AllFormFactors.ExtensionPoint;
    expect(resource("ShortStrings", cf.Namespace["@resid"])).toBe("ASKEW");
    expect(resource("Urls", cf.Script.SourceLocation["@resid"])).toMatch(/\/functions\.js$/);
    expect(resource("Urls", cf.Metadata.SourceLocation["@resid"])).toMatch(/\/functions\.json$/);
  });

  test("every resid used is defined", () => {
    const used = [...xml.matchAll(/resid="([^"]+)"/g)].map((m) => m[1]);
    const defined = new Set([...xml.matchAll(/<bt:(?:Url|Image|String) id="([^"]+)"/g)].map((m) => m[1]));
    for (const id of used) expect(defined.has(id) ? id : `missing ${id}`).toBe(id);
  });

  test("every URL is on https://localhost:3000 and names a file the build emits", () => {
    const urls = [...xml.matchAll(/DefaultValue="(https?:\/\/[^"]+)"/g)].map((m) => m[1]);
    expect(urls.length).toBeGreaterThan(5);
    for (const u of urls) {
      expect(u.startsWith("https://localhost:3000/")).toBe(true);
      const file = path.join(root, "dist", new URL(u).pathname);
      expect(fs.existsSync(file) ? u : `not built: ${u}`).toBe(u);
    }
  });

  test("icons are our PNGs at their declared sizes", () => {
    for (const img of res.Images.Image as Array<Record<string, string>>) {
      const size = Number(/icon-(\d+)\.png$/.exec(img["@DefaultValue"])![1]);
      expect(pngSize(path.join(root, "assets", `icon-${size}.png`))).toEqual([size, size]);
    }
    for (const s of [16, 32, 80]) expect(res.Images.Image.some((i: Record<string, string>) => i["@DefaultValue"].endsWith(`icon-${s}.png`))).toBe(true);
  });
});

/** The vendored schemas (source, commit and local changes in test/fixtures/manifest-xsd/README.md). */
const xsdDir = path.join(root, "test/fixtures/manifest-xsd");
async function schemaErrors(text: string): Promise<string[]> {
  const files = fs.readdirSync(xsdDir).filter((f) => f.endsWith(".xsd")).map((f) => ({ fileName: f, contents: fs.readFileSync(path.join(xsdDir, f), "utf8") }));
  const main = files.find((f) => f.fileName === "OfficeAppManifestV1_1.xsd")!;
  const r = await validateXML({ xml: [{ fileName: "manifest.xml", contents: text }], schema: [main], preload: files.filter((f) => f !== main) });
  return r.valid ? [] : r.errors.map((e) => `line ${e.loc?.lineNumber}: ${e.message}`);
}

describe("manifest.xml against the add-in manifest schemas, offline (https://learn.microsoft.com/en-us/office/dev/add-ins/testing/troubleshoot-manifest)", () => {
  // "Validate the manifest against the XML Schema Definition (XSD) files" (troubleshoot-manifest); element order
  // matters (https://learn.microsoft.com/en-us/office/dev/add-ins/develop/manifest-element-ordering).
  test("is valid", async () => {
    expect(await schemaErrors(xml)).toEqual([]);
  });

  test("the check can fail: an empty AppDomains, an element out of order and an unknown runtime lifetime are refused", async () => {
    const empty = await schemaErrors(xml.replace("<Hosts>", "<AppDomains/>\n  <Hosts>"));
    expect(empty.join("\n")).toMatch(/AppDomains': Missing child element/);
    const order = await schemaErrors(xml.replace(/(<Version>[^<]*<\/Version>)(\s*)(<ProviderName>[^<]*<\/ProviderName>)/, "$3$2$1"));
    expect(order.length).toBeGreaterThan(0);
    const lifetime = await schemaErrors(xml.replace('lifetime="long"', 'lifetime="forever"'));
    expect(lifetime.join("\n")).toMatch(/lifetime/);
  });
});

/**
 * Requirement sets of the APIs the code uses: each is declared in the manifest (the add-in then loads only where
 * the set exists) or guarded at run time by Office.context.requirements.isSetSupported in the same file (the
 * option is then offered only where it works). https://learn.microsoft.com/en-us/office/dev/add-ins/develop/specify-office-hosts-and-api-requirements
 */
describe("every API used has its requirement set declared or checked", () => {
  const sets = new Map<string, number>(app.Requirements.Sets.Set.map((s: Record<string, string>) => [s["@Name"], Number(s["@MinVersion"])]));
  const sources = (dir: string): Array<[string, string]> =>
    fs.readdirSync(path.join(root, dir), { recursive: true, withFileTypes: false } as never)
      .map((f) => String(f))
      .filter((f) => f.endsWith(".ts"))
      .map((f) => [path.join(dir, f), fs.readFileSync(path.join(root, dir, f), "utf8")] as [string, string]);
  const code = [...sources("src/functions"), ...sources("src/taskpane")];
  // API → set and version, from each API's reference page ("API set: …").
  const USES: ReadonlyArray<{ api: RegExp; set: string; version: string; doc: string }> = [
    { api: /new CustomFunctions\.Error\(/, set: "CustomFunctionsRuntime", version: "1.2", doc: "https://learn.microsoft.com/en-us/javascript/api/custom-functions-runtime/customfunctions.error" },
    { api: /worksheets\.onChanged\b/, set: "ExcelApi", version: "1.9", doc: "https://learn.microsoft.com/en-us/javascript/api/excel/excel.worksheetcollection#excel-excel-worksheetcollection-onchanged-member" },
    { api: /\.onVisibilityModeChanged\b/, set: "SharedRuntime", version: "1.1", doc: "https://learn.microsoft.com/en-us/javascript/api/office/office.addin#office-office-addin-onvisibilitymodechanged-member(1)" },
  ];

  test.each(USES.map((u) => [u.set + " " + u.version, u]))("%s", (_s, u) => {
    const users = code.filter(([, text]) => u.api.test(text));
    for (const [file, text] of users) {
      const declared = (sets.get(u.set) ?? 0) >= Number(u.version);
      const guarded = new RegExp(`isSetSupported\\(\\s*["']${u.set}["']\\s*,\\s*["']${u.version.replace(".", "\\.")}["']`).test(text);
      expect({ file, api: u.api.source, declaredOrGuarded: declared || guarded }).toEqual({ file, api: u.api.source, declaredOrGuarded: true });
    }
  });

  test("the API patterns find their users (the walk is not empty)", () => {
    expect(code.some(([, t]) => USES[0].api.test(t))).toBe(true);
    expect(code.some(([, t]) => USES[1].api.test(t))).toBe(true);
    expect(code.some(([, t]) => USES[2].api.test(t))).toBe(true);
  });
});
