import { defineCommand } from '../../args/optionTable.js';
import { reportArguments, reportOptions } from './reportOptions.js';

/** `bridgework report`: the design report of each channel. */
export const reportCommand = defineCommand({
  name: 'report',
  summary: 'Design report of each channel: error budget, noise, design checks.',
  description:
    "Prints the budget of each channel in the file as a table, in the units people read (µε, mV/V, kN...): every line of the channel package's budget with its effect at the budget point, its standard uncertainty and its share of the combined variance (noise, resolution, nonlinearity of a linear map, lead desensitization, each stated tolerance, sensor temperature, and the sensor kind's own lines such as an RTD's class), the combined standard and expanded uncertainty, noise by source, resolution, and the channel package's design checks: the span's converter codes and share of the converter's range, the expanded uncertainty and the noise against the span, every figure finite, the front end's headroom, and each input against its usual range (pass, warn or fail, each figure against its threshold).\n\n" +
    "With --json the same content is printed as JSON for scripts, in the channel's own unit, with each line's model and inputs. With --html a self-contained HTML report is written as well, with plots (converter input against the quantity beside the terminal line, the nonlinearity of that line, error budget bars, noise contributions), each line's model and the inputs of each channel.\n\n" +
    'The exit code is 2 when a design check fails (a warning leaves it 0); the reports are still printed and written.',
  positionals: reportArguments,
  options: reportOptions,
  examples: [
    { command: 'bridgework report hopper.yaml', description: 'Print the budget of every channel.' },
    {
      command: 'bridgework report hopper.yaml --html hopper.html',
      description: 'Also write the HTML report with plots.',
    },
    {
      command: 'bridgework report hopper.yaml --channel north-cell --json -o north.json',
      description: 'Write one channel’s budget as JSON to a file.',
    },
  ],
  load: () => import('./runReport.js'),
});
