// The Cellsmith side of `npm run bench -- ingest`, run in its own process so its peak memory is
// its own: stream-parse the CSV from disk, align lambda, filter, accumulate. Prints one JSON line.
import { readFileSync } from 'node:fs';
import { accumulateCells } from '../shared/accumulate';
import { alignLambda } from '../shared/align';
import { requireChannel } from '../shared/core/channels';
import type { TableAxes } from '../shared/sim/sim-vehicle';
import { filterSamples } from '../shared/filter';
import { importCsvFile } from '../server/services/csv-file';
import { BENCH_FILTER_RULES } from './ingest-rules';

async function main(): Promise<void> {
  const [csvPath, axesPath, displacement] = process.argv.slice(2);
  if (!csvPath || !axesPath || !displacement)
    throw new Error('usage: ingest-run CSV AXES_JSON DISPLACEMENT_L');
  const axes = JSON.parse(readFileSync(axesPath, 'utf8')) as TableAxes;
  const start = process.hrtime.bigint();
  const { log } = await importCsvFile(csvPath, undefined, { stoichAfr: 14.7 });
  const parsed = process.hrtime.bigint();
  const aligned = alignLambda(log, { displacementL: Number(displacement) }).log;
  const { keep } = filterSamples(aligned, BENCH_FILTER_RULES);
  const filtered = process.hrtime.bigint();
  const cells = accumulateCells({
    rpmAxis: axes.rpmAxis,
    mapAxisKpa: axes.mapAxisKpa,
    rpm: requireChannel(aligned, 'rpm'),
    mapKpa: requireChannel(aligned, 'map'),
    lambda: requireChannel(aligned, 'lambda'),
    lambdaTarget: requireChannel(aligned, 'lambdaTarget'),
    stft: aligned.channels.stft,
    ltft: aligned.channels.ltft,
    keep,
  });
  const end = process.hrtime.bigint();
  const s = (a: bigint, b: bigint): number => Number(b - a) / 1e9;
  const kept = keep.reduce((n, k) => n + k, 0);
  console.log(
    JSON.stringify({
      seconds: s(start, end),
      parseS: s(start, parsed),
      alignFilterS: s(parsed, filtered),
      accumulateS: s(filtered, end),
      peakMiB: process.resourceUsage().maxRSS / 1024,
      rows: log.length,
      kept,
      cells: cells.weight.data.filter((w) => w > 0).length,
    }),
  );
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
