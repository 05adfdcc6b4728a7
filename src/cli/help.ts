// Help text pieces shared by the commands.

/**
 * Example commands for the end of a command's help, one per line. Commander wraps a command's
 * description to the terminal's width but prints text added after the help as it is, so an example
 * stays whole and can be copied.
 */
export function examples(commands: readonly string[]): string {
  return '\nExamples:\n' + commands.map((c) => `  ${c}\n`).join('');
}
