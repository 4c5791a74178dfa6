// Number formats as spreadsheets write them. Outside reference: the locale data of the Unicode CLDR
// (48.0) as ICU (78.2) formats it through Node's Intl.NumberFormat — every string below that is
// "formatted by <locale>" comes from it, not from the project; the rest are common practice.
import { looksNumeric, markEvidence, parseNumberText } from "../../src/io";

const LOCALES: [string, "." | ","][] = [
  ["en-US", "."], ["en-GB", "."], ["de-DE", ","], ["fr-FR", ","], ["de-CH", "."], ["sv-SE", ","], ["es-ES", ","],
  ["it-IT", ","], ["nl-NL", ","], ["fr-CH", ","], ["pt-BR", ","], ["pl-PL", ","], ["nb-NO", ","],
];
const VALUES = [1234567.5, -1850, 0.25, 66190, -1850.25, 12, 999.125];

describe("CLDR/ICU-formatted numbers read back to the value (Node Intl.NumberFormat, CLDR 48.0)", () => {
  for (const [locale, mark] of LOCALES) {
    test(`${locale}: plain, grouped, currency (EUR, USD accounting) and percent`, () => {
      const plain = new Intl.NumberFormat(locale, { minimumFractionDigits: 2, maximumFractionDigits: 3 });
      const eur = new Intl.NumberFormat(locale, { style: "currency", currency: "EUR" });
      const usd = new Intl.NumberFormat(locale, { style: "currency", currency: "USD", currencySign: "accounting" });
      const pct = new Intl.NumberFormat(locale, { style: "percent", minimumFractionDigits: 1 });
      // CLDR's fr-CH writes plain numbers with a decimal comma but amounts of money with a point.
      const money = locale === "fr-CH" ? "." : mark;
      for (const v of VALUES) {
        expect([plain.format(v), parseNumberText(plain.format(v), mark)?.value]).toEqual([plain.format(v), v]);
        const cents = Math.round(v * 100) / 100;
        expect([eur.format(cents), parseNumberText(eur.format(cents), money)?.value]).toEqual([eur.format(cents), cents]);
        expect([usd.format(cents), parseNumberText(usd.format(cents), money)?.value]).toEqual([usd.format(cents), cents]);
      }
      expect(parseNumberText(pct.format(0.125), mark)?.value).toBe(0.125);
    });
  }
  test("fr-FR groups with a narrow no-break space and sv-SE writes the Unicode minus (what is being read)", () => {
    expect(new Intl.NumberFormat("fr-FR").format(1234)).toBe("1\u202f234");
    expect(new Intl.NumberFormat("sv-SE").format(-5)).toBe("\u22125");
    expect(parseNumberText("1\u202f234", ",")).toMatchObject({ value: 1234, thousands: " " });
    expect(parseNumberText("\u22125", ",")).toMatchObject({ value: -5, negative: "unicode-minus" });
  });
});

describe("each format rule (common practice)", () => {
  test("thousands separators , . ' ’ space and no-break space", () => {
    expect(parseNumberText("1,234,567.5", ".")?.value).toBe(1234567.5);
    expect(parseNumberText("1.234.567,5", ",")?.value).toBe(1234567.5);
    expect(parseNumberText("1'234'567.5", ".")?.value).toBe(1234567.5);
    expect(parseNumberText("1’234’567.5", ".")?.value).toBe(1234567.5);
    expect(parseNumberText("1 234 567,5", ",")?.value).toBe(1234567.5);
    expect(parseNumberText("1\u00a0234\u00a0567,5", ",")?.value).toBe(1234567.5);
  });
  test("a bad grouping, two decimal marks, two signs or two currencies are not numbers", () => {
    for (const [t, m] of [["1,23,4", "."], ["1.2.3", "."], ["12,34.5", "."], ["1.234,5,6", ","], ["--5", "."], ["-(5)", "."], ["$5 €", "."], ["0.123.456", ","], ["1,2345", "."], ["5%%", "."]] as const) {
      expect([t, parseNumberText(t, m)]).toEqual([t, null]);
    }
  });
  test("decimal comma", () => {
    expect(parseNumberText("66190,5", ",")?.value).toBe(66190.5);
    expect(parseNumberText("66190,5", ".")).toBeNull();
  });
  test("currency symbols and codes before or after", () => {
    expect(parseNumberText("$1,850.00", ".")).toMatchObject({ value: 1850, currency: "$" });
    expect(parseNumberText("1.850,00 €", ",")).toMatchObject({ value: 1850, currency: "€" });
    expect(parseNumberText("£12", ".")).toMatchObject({ value: 12, currency: "£" });
    expect(parseNumberText("CHF 1'850.50", ".")).toMatchObject({ value: 1850.5, currency: "CHF" });
    expect(parseNumberText("1850 EUR", ",")).toMatchObject({ value: 1850, currency: "EUR" });
    expect(parseNumberText("EUR-66'190.00", ".")).toMatchObject({ value: -66190, currency: "EUR" });
  });
  test("percent is divided by 100, as a spreadsheet stores it", () => {
    expect(parseNumberText("12.5%", ".")).toMatchObject({ value: 0.125, percent: true });
    expect(parseNumberText("12,5 %", ",")?.value).toBe(0.125);
  });
  test("negatives: minus, accounting parentheses, trailing minus, Unicode minus", () => {
    expect(parseNumberText("-1,850", ".")).toMatchObject({ value: -1850, negative: "minus" });
    expect(parseNumberText("(1,850)", ".")).toMatchObject({ value: -1850, negative: "accounting" });
    expect(parseNumberText("($1,850.25)", ".")).toMatchObject({ value: -1850.25, negative: "accounting", currency: "$" });
    expect(parseNumberText("1.850-", ",")).toMatchObject({ value: -1850, negative: "trailing-minus" });
    expect(parseNumberText("\u22121 850,00", ",")).toMatchObject({ value: -1850, negative: "unicode-minus" });
  });
  test("what each mark says: 1,234 is ambiguous; 66.190,00 only comma; 12.50 only point; 1234 the same", () => {
    expect(markEvidence("1,234")).toBe("ambiguous");
    expect(markEvidence("1.850")).toBe("ambiguous");
    expect(markEvidence("66.190,00")).toBe(",");
    expect(markEvidence("12.50")).toBe(".");
    expect(markEvidence("1,234.5")).toBe(".");
    expect(markEvidence("1234")).toBe("same");
    expect(markEvidence("Total")).toBe("none");
  });
  test("looksNumeric tells a malformed number from a word", () => {
    expect(looksNumeric("1.2.3,4")).toBe(true);
    expect(looksNumeric("€ 12,34,5")).toBe(true);
    expect(looksNumeric("closed")).toBe(false);
    expect(looksNumeric("n/a")).toBe(false);
  });
});
