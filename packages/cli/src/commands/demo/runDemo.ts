import { mkdir, mkdtemp, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { BridgeworkError } from '@bridgework/core';
import { loadChannels } from '../../channels/loadChannels.js';
import { streamSink } from '../../data/outputSink.js';
import { exitCodes } from '../../exitCodes.js';
import { openAtomicFile, type AtomicFile } from '../../files/atomicFile.js';
import { readVersion } from '../../internal/readVersion.js';
import { constantsText } from '../../report/constantsText.js';
import { designReport } from '../../report/designReport.js';
import { designReportHtml } from '../../report/designReportHtml.js';
import { formatTextReport } from '../../report/formatTextReport.js';
import { runDate } from '../../report/runDate.js';
import type { CommandContext } from '../CommandContext.js';
import type { DemoArgs } from './demoCommand.js';

/**
 * The demo's channel file, `examples/footbridge-monitoring.yaml` of the repository: the same
 * number of folders above `src/commands/demo/` and `dist/commands/demo/`.
 */
export const demoChannelFile = fileURLToPath(
  new URL('../../../../../examples/footbridge-monitoring.yaml', import.meta.url),
);

/** The files the demo writes, in its folder. */
export const demoFiles = { html: 'footbridge-monitoring.html', header: 'footbridge_constants.h' } as const;

/**
 * The body of `bridgework demo`: the design report of the built-in example channel file, printed,
 * with its HTML report and C header written into a folder whose paths are printed.
 *
 * @remarks
 * The example is `examples/footbridge-monitoring.yaml` (an invented footbridge test: a hanger's
 * force from a full-poisson bridge, a gusset's strain from a quarter bridge, the deck's
 * temperature from an RTD). The folder is `--dir` (created if needed) or a new folder in the
 * system's temporary folder; existing files there are replaced only with `--force`. Both files
 * are opened before any work and written atomically. The header's bounds are verified by the
 * `'sampled'` mode (the analytic bound, checked on about 50 000 codes per map), so the demo takes
 * a few seconds; `bridgework constants` verifies exhaustively by default. The exit code is the report's: 2 when a
 * design check fails (the example's checks pass).
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok` or `exitCodes.failedCheck`.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error` when the example is missing (the
 * demo runs from a clone of the repository) or the folder cannot be made; `file-exists`.
 */
export async function run(args: DemoArgs, context: CommandContext): Promise<number> {
  try {
    await stat(demoChannelFile);
  } catch (e) {
    throw new BridgeworkError(
      'io-error',
      `the demo's channel file ${demoChannelFile} is missing: the demo runs from a clone of the bridgework repository`,
      { param: demoChannelFile, cause: e },
    );
  }
  let dir: string;
  try {
    if (args.options.dir === undefined) dir = await mkdtemp(join(tmpdir(), 'bridgework-demo-'));
    else {
      dir = args.options.dir;
      await mkdir(dir, { recursive: true });
    }
  } catch (e) {
    throw new BridgeworkError(
      'io-error',
      `cannot make the folder ${args.options.dir ?? tmpdir()}: ${String(e)}`,
      {
        param: '--dir',
        cause: e,
      },
    );
  }
  const htmlPath = join(dir, demoFiles.html);
  const headerPath = join(dir, demoFiles.header);
  const files: AtomicFile[] = [];
  try {
    const force = { force: args.options.force };
    const html = await openAtomicFile(htmlPath, force);
    files.push(html);
    const header = await openAtomicFile(headerPath, force);
    files.push(header);
    const shown = relative(process.cwd(), demoChannelFile);
    const loaded = await loadChannels(shown.startsWith('..') ? demoChannelFile : shown);
    const report = designReport(loaded);
    const generator = `bridgework ${await readVersion()}`;
    await html.write(designReportHtml(report, { points: 201, generator, date: runDate(context.io.env) }));
    await header.write(
      // 'sampled': the analytic bounds, checked on about 50 000 codes per map, which keeps the demo
      // quick (the RTD's exact map over 2.8 million codes takes seconds to verify exhaustively).
      constantsText(loaded, { format: 'c', prefix: 'footbridge', verification: 'sampled', generator }),
    );
    await html.commit();
    await header.commit();
    const style = context.stdoutStyle;
    const intro =
      `${style.bold('bridgework demo')}: the design report of ${loaded.file.file},\n` +
      'an invented footbridge test: a hanger force, a gusset strain and the deck temperature.\n\n';
    const outro =
      `\n${style.bold('The demo wrote:')}\n` +
      `  HTML report with plots  ${htmlPath}\n` +
      `  C header of constants   ${headerPath}\n\n` +
      'Open the HTML report in a browser. From this clone, run the command on a channel file of your own:\n' +
      '  pnpm bridgework report <channel-file> --html report.html\n' +
      '  pnpm bridgework constants <channel-file> -o constants.h\n' +
      "(docs/cli.md and docs/channel-file.md explain them; 'pnpm bridgework --help' lists every command).\n";
    await streamSink(context.io.stdout).write(intro + formatTextReport(report, style) + outro);
    return report.ok ? exitCodes.ok : exitCodes.failedCheck;
  } finally {
    for (const f of files) await f.abort();
  }
}
