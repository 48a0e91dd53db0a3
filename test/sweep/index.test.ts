import { execFile } from 'node:child_process';
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import * as core from '../../src/index.js';
import * as sweep from '../../src/sweep/index.js';

// What a module graph loads, observed at run time: a child node process (tsx for
// the TypeScript sources) registers a resolve hook that records every URL resolved
// while importing the given module, and prints the list.
const RECORDER = `
export function initialize(data) { globalThis.port = data.port; }
export async function resolve(specifier, context, next) {
  const r = await next(specifier, context);
  globalThis.port.postMessage(r.url);
  return r;
}`;

const CHILD = `
import { register } from 'node:module';
import { MessageChannel } from 'node:worker_threads';
const { port1, port2 } = new MessageChannel();
const urls = [];
port1.on('message', (u) => urls.push(u));
register('data:text/javascript,' + encodeURIComponent(${JSON.stringify(RECORDER)}), { data: { port: port2 }, transferList: [port2] });
await import(process.argv[1]);
await new Promise((r) => setTimeout(r, 200));
port1.close();
process.stdout.write(JSON.stringify(urls));
`;

function loadedBy(moduleUrl: string): Promise<string[]> {
  const tsx = pathToFileURL(createRequire(import.meta.url).resolve('tsx')).href;
  return new Promise((resolve, reject) => {
    execFile(process.execPath, ['--import', tsx, '--input-type=module', '-e', CHILD, moduleUrl], (error, stdout) => {
      if (error) reject(error);
      else resolve(JSON.parse(stdout) as string[]);
    });
  });
}

const HEAVY = [/^node:worker_threads$/, /\/node_modules\/zod\//, /\/node_modules\/cli-progress\//, /\/src\/sweep\//];

describe('fluxstate/sweep entry point', () => {
  it('exports the sweep API, which the core import does not', () => {
    for (const name of ['runSweep', 'runSweepCase', 'parseSweepJob', 'applySweepEdits', 'terminalProgress', 'shardSweepJob', 'mergeSweepResults', 'sweepResultToJson', 'sweepResultFromJson', 'networkFromDescription', 'sweepCase', 'sweepCaseCount']) {
      expect(sweep).toHaveProperty(name);
      expect(core).not.toHaveProperty(name);
    }
    expect(core).toHaveProperty('handlesOf');
  });

  it('the core import loads neither worker_threads, zod, cli-progress nor any sweep module (observed at run time)', async () => {
    const coreUrls = await loadedBy(new URL('../../src/index.ts', import.meta.url).href);
    expect(coreUrls.some((u) => u.endsWith('/src/simulate.ts'))).toBe(true); // the recorder saw the graph
    for (const heavy of HEAVY) expect(coreUrls.filter((u) => heavy.test(u))).toEqual([]);
    // The same recorder does see them behind the sweep entry point.
    const sweepUrls = await loadedBy(new URL('../../src/sweep/index.ts', import.meta.url).href);
    for (const heavy of HEAVY) expect(sweepUrls.some((u) => heavy.test(u))).toBe(true);
  });
});
