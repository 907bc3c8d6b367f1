import { mkdir, mkdtemp, readFile } from 'node:fs/promises';
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
import { packageFile } from '../../internal/packageFile.js';
import { runDate } from '../../report/runDate.js';
import type { CommandContext } from '../CommandContext.js';
import type { DemoArgs } from './demoOptions.js';

/**
 * The demo's channel file, shipped in the package as `demo/footbridge-monitoring.yaml` and found
 * from the command's own location (see `packageFile`), never relative to the working folder.
 */
export const demoChannelFile = fileURLToPath(packageFile('demo/footbridge-monitoring.yaml'));

/** The files the demo writes, in its folder: the reports and a copy of the channel file to edit. */
export const demoFiles = {
  html: 'footbridge-monitoring.html',
  header: 'footbridge_constants.h',
  channelFile: 'footbridge-monitoring.yaml',
} as const;

/**
 * The body of `bridgework demo`: the design report of the built-in example channel file, printed,
 * with its HTML report and C header written into a folder whose paths are printed.
 *
 * @remarks
 * The example is the package's `demo/footbridge-monitoring.yaml` (an invented footbridge test: a
 * hanger's force from a full-poisson bridge, a gusset's strain from a quarter bridge, the deck's
 * temperature from an RTD), so the demo works wherever the package is installed. The folder is
 * `--dir` (created if needed) or a new folder in the system's temporary folder; existing files
 * there are replaced only with `--force`. The HTML report, the C header and a copy of the channel
 * file (to edit and run the other commands on) are opened before any work and written atomically. The header's bounds are verified by the
 * `'sampled'` mode (the analytic bound, checked on about 50 000 codes per map), so the demo takes
 * a few seconds; `bridgework constants` verifies exhaustively by default. The exit code is the report's: 2 when a
 * design check fails (none of the example's does; its gusset gauge warns that its span uses only 2.5 %
 * of the converter's range).
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok` or `exitCodes.failedCheck`.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error` when the example is missing from the
 * package or the folder cannot be made; `file-exists`.
 */
export async function run(args: DemoArgs, context: CommandContext): Promise<number> {
  let example: string;
  try {
    example = await readFile(demoChannelFile, 'utf8');
  } catch (e) {
    throw new BridgeworkError(
      'io-error',
      `the demo's channel file ${demoChannelFile} is missing: reinstall the bridgework package`,
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
  const copyPath = join(dir, demoFiles.channelFile);
  const files: AtomicFile[] = [];
  try {
    const force = { force: args.options.force };
    const html = await openAtomicFile(htmlPath, force);
    files.push(html);
    const header = await openAtomicFile(headerPath, force);
    files.push(header);
    const copy = await openAtomicFile(copyPath, force);
    files.push(copy);
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
    // The copy points editors at the schema shipped in the package.
    const schema = fileURLToPath(packageFile('schema/channel-file.schema.json'));
    await copy.write(
      example.replace(/^# yaml-language-server: \$schema=.*$/m, `# yaml-language-server: $schema=${schema}`),
    );
    await html.commit();
    await header.commit();
    await copy.commit();
    const style = context.stdoutStyle;
    const intro =
      `${style.bold('bridgework demo')}: the design report of ${loaded.file.file},\n` +
      'an invented footbridge test: a hanger force, a gusset strain and the deck temperature.\n\n';
    const outro =
      `\n${style.bold('The demo wrote:')}\n` +
      `  HTML report with plots  ${htmlPath}\n` +
      `  C header of constants   ${headerPath}\n` +
      `  channel file (a copy)   ${copyPath}\n\n` +
      'Open the HTML report in a browser. Edit the copy of the channel file and run the command on it:\n' +
      `  bridgework report ${copyPath} --html report.html\n` +
      `  bridgework constants ${copyPath} -o constants.h\n` +
      "('bridgework --help' lists every command; in a clone of the repository, 'pnpm bridgework' runs it).\n";
    await streamSink(context.io.stdout).write(intro + formatTextReport(report, style) + outro);
    return report.ok ? exitCodes.ok : exitCodes.failedCheck;
  } finally {
    for (const f of files) await f.abort();
  }
}
