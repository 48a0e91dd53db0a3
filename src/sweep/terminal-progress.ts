import cliProgress from 'cli-progress';
import type { SweepProgress } from './sweep-result.js';

/**
 * Options of {@link terminalProgress}.
 *
 * @example
 * ```ts
 * const onProgress = terminalProgress({ stream: process.stdout, label: 'inrush study' });
 * ```
 */
export interface TerminalProgressOptions {
  /** Where the bar is drawn. Default `process.stderr` (so results on stdout stay clean). */
  readonly stream?: NodeJS.WriteStream;
  /** Text before the bar. Default `'sweep'`. */
  readonly label?: string;
}

/**
 * A progress callback for {@link runSweep} that draws a progress bar
 * (cli-progress) with the cases done, the failures and an ETA, when the
 * stream is a terminal; silent otherwise (CI logs, pipes, batch jobs), so
 * it can always be passed.
 *
 * @example
 * ```ts
 * const result = await runSweep(job, { onProgress: terminalProgress() });
 * ```
 */
export function terminalProgress(options: TerminalProgressOptions = {}): (progress: SweepProgress) => void {
  const stream = options.stream ?? process.stderr;
  if (!stream.isTTY) return () => {};
  const label = options.label ?? 'sweep';
  let bar: cliProgress.SingleBar | undefined;
  const payload = (p: SweepProgress) => ({ failed: p.counts.error + p.counts.incomplete });
  return (p) => {
    if (p.phase === 'start') {
      bar = new cliProgress.SingleBar(
        {
          stream,
          format: `${label} [{bar}] {percentage}% | {value}/{total} cases | {failed} failed | ETA {eta_formatted}`,
          hideCursor: true,
          fps: 5,
        },
        cliProgress.Presets.shades_classic,
      );
      bar.start(p.total, 0, payload(p));
      return;
    }
    bar?.update(p.done, payload(p));
    if (p.phase === 'end') {
      bar?.stop();
      bar = undefined;
    }
  };
}
