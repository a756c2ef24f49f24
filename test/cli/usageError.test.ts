import { describe, expect, it } from 'vitest';
import { usageErrorText, usageProblem } from '../../src/cli/usageError.js';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/cliIo.js';

// The inputs are commander 14's own error texts (node_modules/commander/lib/command.js:
// unknownOption, unknownCommand, _excessArguments, optionMissingArgument, and the
// InvalidArgumentError wrapping in _callParseArg), each rewritten into our one problem format.
describe('usage errors in the problem format', () => {
  it('an invalid option argument names the option, keeps the parser message and points to the help', () => {
    expect(usageProblem("error: option '--alpha <a>' argument '0.7' is invalid. alpha must be in (0, 0.5)", 'quantbid plan')).toEqual({
      file: 'command line',
      field: '--alpha',
      message: '"0.7" is not accepted: alpha must be in (0, 0.5)',
      fix: 'see quantbid plan --help',
    });
  });

  it("keeps commander's suggestion for a misspelt option or command", () => {
    expect(usageErrorText("error: unknown option '--alhpa'\n(Did you mean --alpha?)", 'quantbid plan')).toBe(
      'command line: --alhpa: unknown option (did you mean --alpha?); see quantbid plan --help for the options\nnothing was written.\n',
    );
    expect(usageProblem("error: unknown command 'plna'\n(Did you mean plan?)", 'quantbid').message).toBe('unknown command (did you mean plan?)');
  });

  it('a message it does not know keeps its text, still with what to do', () => {
    expect(usageProblem('error: something new', 'quantbid size')).toEqual({ file: 'command line', message: 'something new', fix: 'see quantbid size --help' });
  });

  it('through main: exit code 2, nothing on stdout, one problem line then "nothing was written."', async () => {
    let stdout = '';
    let stderr = '';
    const io: CliIo = { stdout: (s) => void (stdout += s), stderr: (s) => void (stderr += s), stderrIsTerminal: false };
    const code = await main(['node', 'quantbid', 'backtest', '--alpha', '0.9'], io);
    expect(code).toBe(2);
    expect(stdout).toBe('');
    const lines = stderr.trimEnd().split('\n');
    expect(lines).toHaveLength(2);
    expect(lines[0]).toMatch(/^command line: --alpha: "0\.9" is not accepted: .+; see quantbid backtest --help$/);
    expect(lines[1]).toBe('nothing was written.');
  });
});
