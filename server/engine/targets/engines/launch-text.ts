import { parseJsonTyped, pointer, writeJsonText } from "../json-text";
import { ENGINE_FLOAT_KEYS, floatKeyTest } from "../float-keys";
import type { TargetArtifact } from "../types";

/** One-line JSON for a command-line argument, the engines' float-typed keys keeping their decimal point. */
export const compactJson = (value: unknown): string =>
  writeJsonText(value, floatKeyTest(ENGINE_FLOAT_KEYS), { compact: true });

/** A JSON argument parsed as Python's json.loads types it, with the float-typed keys that arrived as ints. */
export function parseJsonArgument(text: string): { value: Record<string, unknown>; intFloats: string[] } {
  const { value, intPaths } = parseJsonTyped(text);
  if (typeof value !== "object" || value === null || Array.isArray(value))
    throw new Error("the JSON argument is not an object");
  const intFloats = [...intPaths].filter((p) =>
    ENGINE_FLOAT_KEYS.has(
      p
        .split("/")
        .filter((s) => !/^\d+$/.test(s))
        .pop() ?? "",
    ),
  );
  return { value: value as Record<string, unknown>, intFloats };
}

export { pointer };

/** POSIX shell single quoting: the text a user pastes runs with exactly these arguments. */
export const shellQuote = (arg: string) =>
  /^[A-Za-z0-9_./:=+-]+$/.test(arg) ? arg : `'${arg.replaceAll("'", `'\\''`)}'`;

/**
 * A launch-arguments artifact: `content.args` is the argument list (no program, no model path), `text` the exact line a
 * user downloads, one argument pair per line, ending in a newline.
 */
export function launchArtifact(command: string, args: string[], extra: Record<string, unknown> = {}): TargetArtifact {
  const lines = [command];
  for (let i = 0; i < args.length; i++) {
    const takesValue = i + 1 < args.length && !args[i + 1].startsWith("--") && !/^-[a-z]$/.test(args[i + 1]);
    lines.push(takesValue ? `${shellQuote(args[i])} ${shellQuote(args[++i])}` : shellQuote(args[i]));
  }
  return { kind: "launch-args", content: { args, ...extra }, text: lines.join(" \\\n  ") + "\n" };
}

/** The value after `flag` (last one wins, as argparse and llama.cpp's parser both keep the last), or undefined. */
export function flagValue(args: readonly string[], flag: string): string | undefined {
  let found: string | undefined;
  args.forEach((a, i) => {
    if (a === flag && i + 1 < args.length) found = args[i + 1];
  });
  return found;
}

export function argsOf(artifact: TargetArtifact): string[] {
  const args = artifact.content.args;
  if (!Array.isArray(args) || !args.every((a) => typeof a === "string"))
    throw new Error("the artifact has no args list");
  return args;
}
