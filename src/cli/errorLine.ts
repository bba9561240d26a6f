/**
 * Commander's own errors (unknown option, missing argument, bad choice) as
 * skyspan prints every error: one line with the `skyspan:` prefix, commander's
 * "error:" word and its "(Did you mean ...?)" line folded into that line, and a
 * pointer to --help.
 */

/** The one-line form of a commander error text. */
export function commanderErrorLine(text: string): string {
  const body = text.replace(/^\s*error:\s*/i, '').replace(/\s*\n\s*/g, ' ').trim();
  return `skyspan: ${body} (run with --help for usage)\n`;
}
