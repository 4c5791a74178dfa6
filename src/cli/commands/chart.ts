// fanwise chart: the fan chart of one series (history, bands, mean and median) as SVG or PNG.
import * as fs from "fs";
import * as path from "path";
import { FanTable } from "../../engine";
import { Command } from "../command";
import { seriesChart } from "../fan-charts";
import { usageError } from "../options";
import { exitCode, seriesError } from "../output";
import { computeFans, FAN_OPTIONS } from "./fan";

export const chartCommand: Command = {
  name: "chart",
  summary: "draw one series' fan chart as an SVG or PNG file",
  args: "FILE",
  options: {
    ...FAN_OPTIONS,
    series: { ...FAN_OPTIONS.series, value: "NAME", help: "the series to draw (default: the first)" },
    out: { type: { kind: "text" }, value: "FILE.svg|FILE.png", help: "where to write the chart; .png is rendered without a browser", example: "fan.png", required: "where to write the chart, e.g. --out fan.svg or --out fan.png." },
    width: { type: { kind: "int", min: 200 }, value: "PX", help: "width in pixels", example: "960", default: "720" },
    height: { type: { kind: "int", min: 150 }, value: "PX", help: "height in pixels", example: "480", default: "360" },
  },
  examples: ["fanwise chart sales.csv --horizon 12 --period 12 --series \"Harbour Street\" --out harbour.svg", "fanwise chart book.xlsx --sheet Sales --horizon 12 --period 12 --out fan.png"],
  async run(p, io) {
    const out = p.text("out") as string;
    const ext = path.extname(out).toLowerCase();
    if (ext !== ".svg" && ext !== ".png") throw usageError(`--out must name an .svg or .png file, e.g. --out fan.png; got "${out}".`);
    const only = p.text("series");
    const { data, fans, names } = await computeFans(p, io, only === undefined ? 1 : undefined);
    if (only === undefined && names.length > 1) io.err(`fanwise: note: drawing the first series, "${fans[0].name}"; choose another with --series NAME (series: ${names.join(", ")}).\n`);
    if (fans.length > 1 && only !== undefined) throw usageError(`A chart draws one series; --series named ${fans.length} (${fans.map((f) => f.name).join(", ")}). Draw each with its own fanwise chart … --series NAME --out FILE.`);
    const t = fans[0];
    if (!t.table) {
      seriesError(io, t.name, t.error);
      return exitCode(0, 1);
    }
    const size = { width: p.int("width") ?? 720, height: p.int("height") ?? 360 };
    const picture = seriesChart(data, t.j, t.table as FanTable, size);
    try {
      if (ext === ".svg") fs.writeFileSync(out, picture.svg);
      else {
        const { svgToPng } = await import("../png");
        fs.writeFileSync(out, svgToPng(picture.svg));
      }
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (typeof code === "string") throw usageError(`Cannot write ${out} (${code === "ENOENT" ? "no such folder" : code === "EACCES" ? "no permission" : code}).`);
      throw e;
    }
    io.out(`Wrote ${out} (${t.name}, ${picture.width}×${picture.height})\n`);
    return 0;
  },
};
