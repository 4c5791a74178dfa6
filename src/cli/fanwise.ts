// The `fanwise` command line: dispatches to one file per command (commands/), each declaring its
// options once; errors go to stderr as one line.
import { isEngineError } from "../engine";
import { Command } from "./command";
import { COMMANDS } from "./commands";
import { commandHelp, generalHelp, version } from "./help";
import { HelpRequest, parseOptions } from "./options";
import { Io, defaultIo, oneLine } from "./output";

export type { Io } from "./output";

function find(name: string): Command | undefined {
  return COMMANDS.find((c) => c.name === name);
}

function unknownCommand(name: string): string {
  return `fanwise: unknown command "${oneLine(name)}". Commands: ${COMMANDS.map((c) => c.name).join(", ")} (fanwise help for more).\n`;
}

/**
 * Runs the command line with the given arguments; resolves to the exit code: 0 every series
 * computed, 1 nothing computed or a usage/file error, 3 some series failed.
 * Every expected problem becomes a one-line message on stderr, never a stack trace.
 * @example await main(["lambda", "sales.csv", "--json"]) // 0, JSON on stdout
 */
export async function main(argv: string[], io: Io = defaultIo): Promise<number> {
  const [name, ...rest] = argv;
  try {
    if (name === "--version" || name === "version") {
      io.out(`fanwise ${version()}\n`);
      return 0;
    }
    if (name === undefined || name === "help" || name === "--help" || name === "-h") {
      const topic = name === "help" ? rest[0] : undefined;
      if (topic !== undefined) {
        const c = find(topic);
        if (!c) {
          io.err(unknownCommand(topic));
          return 1;
        }
        io.out(commandHelp(c));
        return 0;
      }
      io.out(generalHelp(COMMANDS));
      return name === undefined ? 1 : 0;
    }
    const command = find(name);
    if (!command) {
      io.err(unknownCommand(name));
      return 1;
    }
    try {
      return await command.run(parseOptions(command.name, rest, command.options), io);
    } catch (e) {
      if (e instanceof HelpRequest) {
        io.out(commandHelp(command));
        return 0;
      }
      throw e;
    }
  } catch (e) {
    if (isEngineError(e)) {
      io.err(`fanwise: ${oneLine(e.message)}\n`);
      return 1;
    }
    io.err(`fanwise: unexpected problem: ${oneLine(e instanceof Error ? e.message : String(e))}. Please report it.\n`);
    return 1;
  }
}
