/**
 * Data-type cells (entity cards, formatted numbers) reach `any` parameters as objects because the metadata sets
 * allowCustomDataForDataTypeAny (https://learn.microsoft.com/en-us/office/dev/add-ins/excel/custom-functions-data-types-concepts).
 * No ASKEW function reads them: each is refused with a #VALUE! that names the cell and says it holds a data-type
 * value, never "object" and never a silent skip. The object shapes follow the documented cell-value types
 * (https://learn.microsoft.com/en-us/javascript/api/excel/excel.entitycellvalue, excel.doublecellvalue).
 */
import { col, loadBundle, type Bundle } from "./harness";

let b: Bundle;
beforeAll(async () => {
  b = await loadBundle();
});

const entity = { type: "Entity", text: "Desk alpha", properties: { Return: { type: "Double", basicValue: 0.01 } } };
const formatted = { type: "FormattedNumber", basicValue: 0.99, numberFormat: "0%" };
const returns = [0.012, -0.004, 0.007, -0.021, 0.003, 0.009, -0.011, 0.015, -0.002, 0.006, -0.008, 0.004];

test("the metadata turns on custom data for `any` (the reason this test exists)", () => {
  expect((b.metadata as { allowCustomDataForDataTypeAny?: boolean }).allowCustomDataForDataTypeAny).toBe(true);
});

test("a card inside a data range: #VALUE! naming its row and saying it is a data-type value", async () => {
  const data = col(returns);
  data[4] = [entity];
  const e = b.errorOf(await b.run("FIT", data, null));
  expect(e?.code).toBe("#VALUE!");
  expect(e?.message).toContain("row 5, column 1");
  expect(e?.message).toContain('a data-type value (Entity) "Desk alpha"');
  expect(e?.message).not.toMatch(/\bobject\b/);
});

test("a formatted-number value in an element-wise range errors only its own cell, naming what it holds", () => {
  const out = b.call("VAR", [[0.95], [formatted]], [[0], [0.01], [0.1]], null) as unknown[][];
  expect(typeof out[0][0]).toBe("number");
  const e = b.errorOf([[out[1][0]]]);
  expect(e?.code).toBe("#VALUE!");
  expect(e?.message).toContain("a data-type value (FormattedNumber)");
});

test("a card given to a scalar argument: #VALUE! naming the argument", () => {
  const e = b.errorOf(b.call("RANDOM", [[0], [0.01], [0]], entity, 1));
  expect(e?.code).toBe("#VALUE!");
  expect(e?.message).toMatch(/^n must be a number, not a data-type value \(Entity\)/);
});
