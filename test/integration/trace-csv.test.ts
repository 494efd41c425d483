// CSV downloads of the trace page: the quoting rules of RFC 4180 and the formula-injection guard.
import { describe, expect, it } from "vitest";
import { csvFileName, formatCsvCell, toCsv } from "@/app/trace/csv";

describe("trace CSV", () => {
  const cells: Array<[string, string | number | boolean | null, string]> = [
    ["plain text stays bare", "L-0042", "L-0042"],
    // RFC 4180 §2 rule 6: fields containing commas, double quotes or line breaks are enclosed in double quotes.
    ["a comma is quoted", "Larkfold Frozen Meals, Ltd", '"Larkfold Frozen Meals, Ltd"'],
    // RFC 4180 §2 rule 7: a double quote inside a quoted field is escaped by another double quote.
    ["quotes are doubled", 'the "blue" gate', '"the ""blue"" gate"'],
    ["a line break is quoted", "two\nlines", '"two\nlines"'],
    // OWASP "CSV Injection": cells starting with = + - @ (and tab, CR) are prefixed with an apostrophe.
    ["= is neutralised", '=HYPERLINK("x")', '"\'=HYPERLINK(""x"")"'],
    ["+ is neutralised", "+1234", "'+1234"],
    ["- is neutralised", "-2+3", "'-2+3"],
    ["@ is neutralised", "@SUM(A1)", "'@SUM(A1)"],
    ["tab is neutralised", "\tcmd", "'\tcmd"],
    ["numbers are written as they are", 7690386, "7690386"],
    ["empty for null", null, ""],
    ["booleans as yes/no", true, "yes"],
  ];
  it.each(cells)("%s", (_name, input, expected) => {
    expect(formatCsvCell(input)).toBe(expected);
  });

  it("ends every record with CRLF (RFC 4180 §2 rule 1)", () => {
    expect(
      toCsv([
        ["a", "b"],
        [1, "x,y"],
      ]),
    ).toBe('a,b\r\n1,"x,y"\r\n');
  });

  it("makes a header-safe file name", () => {
    expect(csvFileName(["made-of", "P-0102", "lots"])).toBe("made-of-P-0102-lots.csv");
    expect(csvFileName(["where-it-went", 'A"B/C D'])).toBe("where-it-went-A_B_C_D.csv");
  });
});
