// Every fanwise command, in the order help lists them.
import { Command } from "../command";
import { auditCommand } from "./audit";
import { backtestCommand } from "./backtest";
import { chartCommand } from "./chart";
import { demoCommand } from "./demo";
import { fanCommand } from "./fan";
import { lambdaCommand } from "./lambda";
import { publishedCommand } from "./published";
import { screenCommand } from "./screen";
import { totalCommand } from "./total";

/** The commands by name, in the order help lists them. */
export const COMMANDS: readonly Command[] = [screenCommand, lambdaCommand, fanCommand, totalCommand, publishedCommand, auditCommand, backtestCommand, chartCommand, demoCommand];
