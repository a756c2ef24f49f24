/** Where a command writes: injected so that tests capture output without touching the process. */
export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  /** Whether stderr is a terminal (progress bars only then). */
  readonly stderrIsTerminal: boolean;
}

export const processIo: CliIo = {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
  get stderrIsTerminal() {
    return process.stderr.isTTY === true;
  },
};
