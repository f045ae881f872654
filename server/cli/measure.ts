/**
 * npm run measure -- <folder>
 * Prints one JSON result on stdout; progress and errors go to stderr.
 */
import path from 'node:path';
import { MeasurementError } from '../../shared/measure/engine/measurement-error';
import { measureFolder } from '../measure/measure-folder';

async function main(argv: string[]): Promise<number> {
  const folder = argv[0];
  if (!folder || argv.length > 1) {
    process.stderr.write('usage: npm run measure -- <folder>   (the folder holds measurement.json and its frames)\n');
    return 2;
  }
  try {
    let lastPercent = -1;
    const result = await measureFolder(path.resolve(folder), {
      onProgress: (p) => {
        const percent = p.framesTotal ? Math.floor((100 * p.framesDone) / p.framesTotal) : 0;
        if (p.phase === 'measuring' && percent !== lastPercent && percent % 10 === 0) {
          lastPercent = percent;
          process.stderr.write(`measure: ${p.framesDone}/${p.framesTotal} frames\n`);
        } else if (p.phase === 'fitting' || p.phase === 'done') {
          process.stderr.write(`measure: ${p.phase}\n`);
        }
      },
    });
    process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);
    return 0;
  } catch (error) {
    if (error instanceof MeasurementError) {
      process.stderr.write(`measure: ${error.message}\n`);
      return 1;
    }
    // A bug, not the user's fault: say so in one line; the detail only on request.
    const message = error instanceof Error ? error.message : String(error);
    process.stderr.write(`measure: internal error: ${message.split('\n')[0]}\n`);
    if (process.env.PARAXIA_DEBUG) process.stderr.write(`${(error as Error)?.stack ?? ''}\n`);
    return 3;
  }
}

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
