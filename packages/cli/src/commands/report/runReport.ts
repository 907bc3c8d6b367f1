import { resolve } from 'node:path';
import { BridgeworkError } from '@bridgework/core';
import { loadChannels } from '../../channels/loadChannels.js';
import { formatGroupText, groupHtmlSection } from '../../groups/formatGroups.js';
import { groupReport } from '../../groups/groupReport.js';
import { loadGroups } from '../../groups/loadGroups.js';
import { exitCodes } from '../../exitCodes.js';
import { openAtomicFile } from '../../files/atomicFile.js';
import { readVersion } from '../../internal/readVersion.js';
import { designReport } from '../../report/designReport.js';
import { designReportHtml } from '../../report/designReportHtml.js';
import { designReportPayload } from '../../report/designReportPayload.js';
import { formatTextReport } from '../../report/formatTextReport.js';
import { reportJson } from '../../report/reportJson.js';
import { runDate } from '../../report/runDate.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import type { ReportArgs } from './reportOptions.js';

/**
 * The body of `bridgework report`: loads the channel file, computes each channel's budget and
 * design checks (`channelBudget` of the channel package) and prints the text report or `--json`, and with
 * `--html` writes the HTML report.
 *
 * @remarks
 * Output files are opened (and checked for existence without `--force`) once the channel file is
 * read, before the budgets are computed, and committed only when everything is computed, so a
 * failed run writes nothing. The exit code is 2 when a design check fails (a warning does not
 * change it); the reports are still written.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok` or `exitCodes.failedCheck`.
 * @throws {@link @bridgework/core!BridgeworkError} for a bad file (see {@link loadChannels}), an
 * existing output without `--force`, or the same path for `--html` and `--out`.
 */
export async function run(args: ReportArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const out = options.out === '-' ? undefined : options.out;
  if (options.html !== undefined && out !== undefined && resolve(options.html) === resolve(out)) {
    throw new BridgeworkError('conflicting-options', '`--html` and `--out` must name different files', {
      param: '--html',
      value: options.html,
    });
  }
  const files: { abort(): Promise<void> }[] = [];
  try {
    const loaded = await loadChannels(
      args.positionals.channelFile,
      options.channel === undefined ? undefined : [options.channel],
      context.channels,
    );
    const force = { force: options.force };
    const html = options.html === undefined ? undefined : await openAtomicFile(options.html, force);
    if (html !== undefined) files.push(html);
    const output = await openResultOutput(context, out, options.force);
    files.push(output);
    const report = designReport(loaded);
    const groups = (await loadGroups(loaded)).map(groupReport);
    const groupsOk = groups.every((g) => g.ok);
    const generator = `bridgework ${await readVersion()}`;
    if (html !== undefined) {
      await html.write(
        designReportHtml(report, {
          points: options.points,
          generator,
          date: runDate(context.io.env),
          extraSections: groups.map(groupHtmlSection),
        }),
      );
    }
    await output.write(
      options.json
        ? reportJson(
            {
              ...designReportPayload(report),
              ...(groups.length === 0
                ? {}
                : { groups: Object.fromEntries(groups.map((g) => [g.name, g.payload])) }),
            },
            { generator },
          )
        : formatTextReport(report, output.style, {
            sections: groups.map((g) => formatGroupText(g, output.style)),
            ok: groupsOk,
          }),
    );
    if (html !== undefined) {
      await html.commit();
      context.io.stderr.write(`wrote the HTML report to ${options.html}\n`);
    }
    await output.commit(`the ${options.json ? 'JSON' : 'text'} report`);
    return report.ok && groupsOk ? exitCodes.ok : exitCodes.failedCheck;
  } finally {
    for (const f of files) await f.abort();
  }
}
