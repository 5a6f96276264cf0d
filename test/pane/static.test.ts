/**
 * Static checks of the pane's page and style sheet: the Content-Security-Policy stays strict, the markup has
 * no inline script or style, and the palette meets the contrast the design promises, by the WCAG 2.x
 * relative-luminance formula (an open standard: ratio = (L1 + 0.05)/(L2 + 0.05); 4.5:1 for text, 3:1 for
 * graphics such as chart lines).
 */
import * as fs from "node:fs";
import * as path from "node:path";

const root = path.resolve(__dirname, "../..");
const html = fs.readFileSync(path.join(root, "src/taskpane/taskpane.html"), "utf8");
const css = fs.readFileSync(path.join(root, "src/taskpane/taskpane.css"), "utf8");

function palette(): Record<string, string> {
  const out: Record<string, string> = {};
  for (const m of css.matchAll(/--([a-z-]+):\s*(#[0-9a-fA-F]{6})/g)) out[m[1]] = m[2];
  return out;
}

function luminance(hex: string): number {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const lin = c.map((v) => (v <= 0.04045 ? v / 12.92 : Math.pow((v + 0.055) / 1.055, 2.4)));
  return 0.2126 * lin[0] + 0.7152 * lin[1] + 0.0722 * lin[2];
}

function contrast(a: string, b: string): number {
  const [l1, l2] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (l1 + 0.05) / (l2 + 0.05);
}

describe("the page is CSP-clean", () => {
  test("the policy allows our own scripts and styles only (plus the platform's office.js host)", () => {
    const csp = /http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(html)?.[1] ?? "";
    expect(csp).toMatch(/default-src 'self'/);
    expect(csp).toMatch(/script-src 'self' https:\/\/appsforoffice\.microsoft\.com;/);
    expect(csp).toMatch(/style-src 'self';/);
    expect(csp).not.toMatch(/unsafe-inline|unsafe-eval|blob:/);
  });

  test("no inline script, event handler or style attribute in the markup", () => {
    const scripts = [...html.matchAll(/<script([^>]*)>([\s\S]*?)<\/script>/g)];
    for (const [, attrs, body] of scripts) {
      expect(attrs).toMatch(/src=/);
      expect(body.trim()).toBe("");
    }
    expect(html).not.toMatch(/\son[a-z]+=/i);
    expect(html).not.toMatch(/\sstyle=/i);
  });
});

describe("the palette is readable", () => {
  const p = palette();
  test.each([
    ["ink", "paper", 4.5],
    ["ink", "card", 4.5],
    ["muted", "paper", 4.5],
    ["muted", "card", 4.5],
    ["accent", "card", 4.5],
    ["warn-edge", "warn-bg", 4.5],
    ["alarm-ink", "alarm-bg", 4.5],
    ["ink", "alarm-bg", 4.5],
    ["ink", "warn-bg", 4.5],
    ["fit", "card", 3],
    ["normal", "card", 3],
    ["points", "card", 3],
  ])("%s on %s reaches %f:1", (fg, bg, min) => {
    expect(p[fg]).toBeDefined();
    expect(p[bg]).toBeDefined();
    const r = contrast(p[fg], p[bg]);
    if (r < min) throw new Error(`${fg} ${p[fg]} on ${bg} ${p[bg]}: contrast ${r.toFixed(2)} < ${min}`);
  });

  test("white button text on the accent and alarm colours reaches 4.5:1", () => {
    expect(contrast("#ffffff", p.accent)).toBeGreaterThanOrEqual(4.5);
    expect(contrast("#ffffff", p["alarm-ink"])).toBeGreaterThanOrEqual(4.5);
  });

  test("the fitted and normal curves differ by dash, not by colour alone", () => {
    expect(css).toMatch(/\.series-normal \{[^}]*stroke-dasharray/);
    expect(css).not.toMatch(/\.series-fit \{[^}]*stroke-dasharray/);
  });

  test("the WCAG formula itself: black on white is 21:1, white on white 1:1", () => {
    expect(contrast("#000000", "#ffffff")).toBeCloseTo(21, 10);
    expect(contrast("#ffffff", "#ffffff")).toBe(1);
  });
});
