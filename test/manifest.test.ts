/**
 * The add-in manifest, checked offline (the platform's validator needs a network service).
 * Rules come from the host platform's manifest documentation (XML add-in manifest, shared runtime,
 * custom functions extension point); every URL must name a file the build emits.
 */
import * as fs from "node:fs";
import * as path from "node:path";
import { XMLParser, XMLValidator } from "fast-xml-parser";

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
    expect(app.AppDomains === "" || app.AppDomains === undefined).toBe(true);
  });

  test("asks for the shared runtime and custom functions requirement sets", () => {
    const sets = app.Requirements.Sets.Set.map((s: Record<string, string>) => [s["@Name"], s["@MinVersion"]]);
    expect(sets).toEqual(expect.arrayContaining([["SharedRuntime", "1.1"], ["CustomFunctionsRuntime", "1.1"]]));
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
