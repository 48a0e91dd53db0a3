import { Writable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { runSweep, terminalProgress } from '../../src/sweep/index.js';
import { angleJob } from './rl-network.js';

/** A writable that records what is written, posing as a terminal or not. */
function stream(isTTY: boolean): { s: NodeJS.WriteStream; text: () => string } {
  const chunks: string[] = [];
  const w = new Writable({
    write(chunk, _enc, done) {
      chunks.push(String(chunk));
      done();
    },
  }) as unknown as NodeJS.WriteStream;
  Object.assign(w, { isTTY, columns: 100, cursorTo: () => true, clearLine: () => true, moveCursor: () => true });
  return { s: w, text: () => chunks.join('') };
}

describe('terminalProgress', () => {
  it('draws a bar with the cases done on a terminal', async () => {
    const tty = stream(true);
    await runSweep(angleJob([0, 1, 2]), { inProcess: true, onProgress: terminalProgress({ stream: tty.s, label: 'angles' }) });
    expect(tty.text()).toMatch(/angles \[.*\] 100% \| 3\/3 cases \| 0 failed/);
  });

  it('writes nothing when the stream is not a terminal', async () => {
    const pipe = stream(false);
    await runSweep(angleJob([0, 1]), { inProcess: true, onProgress: terminalProgress({ stream: pipe.s }) });
    expect(pipe.text()).toBe('');
  });
});
