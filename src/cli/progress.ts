/**
 * A one-line progress bar on stderr, shown only when stderr is a terminal
 * (so pipes, logs and tests see nothing). The bar fills by stage; a stage
 * may report its own fraction.
 */
export class Progress {
  private stageIndex = -1;
  private stageName = '';
  private fraction = 0;
  private detail = '';
  private readonly started = Date.now();
  private lastDraw = 0;
  private readonly enabled: boolean;

  constructor(private readonly label: string, private readonly stages: number, enabled?: boolean) {
    this.enabled = enabled ?? process.stderr.isTTY === true;
  }

  /** Starts the next stage. */
  stage(name: string): void {
    this.stageIndex++;
    this.stageName = name;
    this.fraction = 0;
    this.detail = '';
    this.draw(true);
  }

  /** Progress within the current stage, 0..1 (redrawn at most 10 times a second). */
  update(fraction: number): void {
    this.fraction = Math.min(1, Math.max(0, fraction));
    this.draw(false);
  }

  /** A note after the stage's name, such as the bytes written so far (redrawn at most 10 times a second). */
  note(detail: string): void {
    this.detail = detail;
    this.draw(false);
  }

  /** Clears the line. */
  done(): void {
    if (this.enabled && this.stageIndex >= 0) process.stderr.write('\r\x1b[2K');
    this.stageIndex = -1;
  }

  private draw(force: boolean): void {
    if (!this.enabled) return;
    const now = Date.now();
    if (!force && now - this.lastDraw < 100) return;
    this.lastDraw = now;
    const width = 24, filled = Math.round(width * (this.stageIndex + this.fraction) / this.stages);
    const bar = '#'.repeat(filled) + '.'.repeat(width - filled);
    const secs = ((now - this.started) / 1000).toFixed(1);
    process.stderr.write(`\r\x1b[2K${this.label} [${bar}] ${this.stageIndex + 1}/${this.stages} ${this.stageName}${this.detail === '' ? '' : ` ${this.detail}`} ${secs}s`);
  }
}
