/**
 * What a command may touch: the runner builds this from the real process; tests build it in memory.
 * Commands never call process.exit or read process.argv themselves.
 */
export interface CliContext {
  readonly cwd: string;
  readonly stdout: (text: string) => void;
  readonly stderr: (text: string) => void;
  /** True once the user pressed Ctrl-C; long commands poll it (it satisfies core's CancelToken). */
  readonly cancel: { readonly cancelled: boolean };
  /** Number of cores, for default --jobs. */
  readonly cores: number;
}

export interface CliCommand {
  readonly spec: import('./args').CommandSpec;
  /** Returns the exit code: 0 success. Input problems are thrown as InputFileError (exit 2). */
  run(argv: readonly string[], ctx: CliContext): Promise<number>;
}
