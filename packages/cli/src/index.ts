// The programmatic surface of the `bridgework` command (the executable is bin.ts).
export { runCli } from './runCli.js';
export { nodeIo, type CliIo, type CliStream } from './cliIo.js';
export { exitCodes, type ExitCode } from './exitCodes.js';
export { SAFETY_CAUTION } from './caution.js';

// Commands and their option tables
export {
  defineCommand,
  type CamelCase,
  type CommandExample,
  type CommandModule,
  type CommandSpec,
  type OptionSpec,
  type OptionType,
  type OptionValue,
  type OptionValues,
  type ParsedArgs,
  type PositionalSpec,
  type PositionalValues,
} from './args/optionTable.js';
export { parseCommandLine, type ParsedCommandLine } from './args/parseCommandLine.js';
export { formatCommandHelp, formatProgramHelp, type HelpFormatOptions } from './args/formatHelp.js';
export { formatCliReference } from './args/formatCliReference.js';
export { commands } from './commands/registry.js';
export type { CommandContext } from './commands/CommandContext.js';
export { openResultOutput, type ResultOutput } from './commands/resultOutput.js';

// Terminal output
export { colorEnabled, createTextStyle, plainTextStyle, type TextStyle } from './terminal/textStyle.js';
export { createProgressBar, type ProgressBar, type ProgressBarOptions } from './terminal/progressBar.js';
export { formatTable, type TableColumn } from './terminal/formatTable.js';

// Files
export {
  openAtomicFile,
  writeFileAtomic,
  type AtomicFile,
  type AtomicFileOptions,
} from './files/atomicFile.js';

// Streamed code conversion
export {
  DEFAULT_BLOCK_FRAMES,
  codeFileFormats,
  type CodeBlock,
  type CodeFileFormat,
  type CodeSource,
} from './data/codeSource.js';
export { openInt32Codes, type Int32CodeOptions } from './data/readInt32Codes.js';
export { openCsvCodes, type CsvCodeOptions } from './data/readCsvCodes.js';
export { codeFormatFromPath, openCodeSource, type OpenCodeSourceOptions } from './data/openCodeSource.js';
export { streamSink, type OutputSink } from './data/outputSink.js';
export { createCsvWriter, type CsvWriter, type CsvWriterOptions } from './data/createCsvWriter.js';
export {
  createClipCounter,
  formatClipSummary,
  type ChannelClipCount,
  type ClipCounter,
  type ClipSummary,
  type ConverterStatus,
  type InterleavedConverter,
} from './data/clipCounter.js';
export {
  convertCodeStream,
  type ConversionResult,
  type ConvertCodeStreamOptions,
} from './data/convertCodeStream.js';
export { convertToCsv, type ConvertToCsvOptions, type ProgressSink } from './data/convertToCsv.js';

// Units and channel files
export { parseQuantity, siUnits, type SiUnit } from './units/parseQuantity.js';
export {
  parseChannelDocument,
  type ChannelDocument,
  type ChannelFileSyntax,
  type SourcePosition,
} from './channelFile/parseChannelDocument.js';
export { readChannelDocument } from './channelFile/readChannelDocument.js';
export { formatIssues } from './channelFile/formatIssues.js';
export {
  loadChannelFile,
  channelNamePattern,
  selectChannels,
  validateChannelDocument,
  type ChannelFile,
  type ChannelValidation,
  type ChannelValidator,
  type LoadChannelFileOptions,
  type NamedChannel,
  type ProjectInfo,
  type QuantityParser,
} from './channelFile/loadChannelFile.js';

export { validateChannelEntry } from './channels/validateChannelEntry.js';
export { loadChannels, type LoadedChannel, type LoadedChannels } from './channels/loadChannels.js';
export { channelFileJsonSchema } from './channels/channelFileJsonSchema.js';

// Reports
export { appendCaution, reportJson, type ReportJsonOptions } from './report/reportJson.js';
export { designReport, type ChannelDesign, type DesignReport } from './report/designReport.js';
export { designChecks, type DesignCheckRow } from './report/designChecks.js';
export { describeChannel } from './report/describeChannel.js';
export { displayUnit, type DisplayUnit } from './report/displayUnit.js';
export {
  formatCode,
  formatNumber,
  formatPercent,
  formatProbability,
  formatStated,
} from './report/formatNumber.js';
export { formatTextReport } from './report/formatTextReport.js';
export { summaryColumns, summaryRows } from './report/summaryTable.js';
export { designReportPayload } from './report/designReportPayload.js';
export { designReportHtml, type DesignReportHtmlOptions } from './report/designReportHtml.js';
export { channelCurves, type ChannelCurves } from './report/channelCurves.js';
export { channelInputs } from './report/channelInputs.js';
export { noiseSourceName } from './report/noiseSourceName.js';
export { runDate } from './report/runDate.js';
export {
  constantsFiles,
  constantsText,
  parsePerChannel,
  parseTypeList,
  type ConstantsFiles,
  type ConstantsTextOptions,
} from './report/constantsText.js';

// Monte Carlo in batches
export {
  BATCH_TRIALS,
  batchSizes,
  batchedMonteCarlo,
  type BatchedMonteCarloOptions,
  type BatchedMonteCarloResult,
} from './uncertainty/batchedMonteCarlo.js';
export {
  formatUncertainty,
  uncertaintyPayload,
  type ChannelUncertainty,
} from './uncertainty/formatUncertainty.js';
export { formatTick, niceTicks, type NiceTicks } from './html/niceTicks.js';
export type { PlotAxis, SvgPlot } from './html/plotTypes.js';
export { linePlot, type LinePlotOptions, type LineSeries } from './html/linePlot.js';
export { barChart, type BarChartOptions, type BarSeries } from './html/barChart.js';
export {
  renderHtmlReport,
  type ChecksBlock,
  type HtmlReportOptions,
  type InputGroup,
  type InputRow,
  type InputsBlock,
  type PlotsBlock,
  type ReportBlock,
  type ReportCheck,
  type ReportMeta,
  type ReportSection,
  type TableBlock,
  type TextBlock,
} from './html/renderHtmlReport.js';
