/**
 * When the language server dies unexpectedly: restart it, tell the user once, and stop trying
 * when it keeps dying (then the user restarts it by command after reading the log). Pure: no
 * editor API, so it is tested on its own.
 */

/** What to do after the server's connection closed unexpectedly. */
export interface RestartDecision {
  /** Start the server again. */
  restart: boolean;
  /** Show the user a message now (the first crash of a session, or giving up). */
  announce: boolean;
  /** The message to show or log. */
  message: string;
}

/** Decides restarts: at most `maxRestarts` within `windowMs`, announcing only the first crash. */
export class RestartPolicy {
  private crashes: number[] = [];
  private announced = false;

  /**
   * @param maxRestarts restarts allowed within the window before giving up
   * @param windowMs the sliding window, ms
   * @param now the clock (replaceable in tests)
   */
  constructor(
    private readonly maxRestarts = 4,
    private readonly windowMs = 3 * 60_000,
    private readonly now: () => number = Date.now,
  ) {}

  /** Records a crash and says what to do. */
  onCrash(): RestartDecision {
    const t = this.now();
    this.crashes = this.crashes.filter((c) => t - c < this.windowMs);
    this.crashes.push(t);
    if (this.crashes.length > this.maxRestarts) {
      const minutes = Math.round(this.windowMs / 60_000);
      return {
        restart: false,
        announce: true,
        message:
          `The Dewmark language server stopped ${this.crashes.length} times ` +
          `in ${minutes} minutes and was not restarted again. The log is in ` +
          `Output → Dewmark; run "Dewmark: Restart Language Server" to try again.`,
      };
    }
    const first = !this.announced;
    this.announced = true;
    return {
      restart: true,
      announce: first,
      message: first
        ? 'The Dewmark language server stopped unexpectedly and was restarted. The log is in Output → Dewmark.'
        : `The Dewmark language server stopped unexpectedly again (${this.crashes.length} ` +
          `in the last ${Math.round(this.windowMs / 60_000)} minutes); restarting it.`,
    };
  }

  /** Forgets past crashes (after the user restarts the server by hand). */
  reset(): void {
    this.crashes = [];
  }
}
