import type { CommandSpec } from '../args/optionTable.js';
import { constantsCommand } from './constants/constantsCommand.js';
import { checkCertificateCommand } from './certificate/certificateCommand.js';
import { convertCommand } from './convert/convertCommand.js';
import { demoCommand } from './demo/demoCommand.js';
import { fitCalibrationCommand } from './fit/fitCommand.js';
import { fitGroupCommand } from './fitGroup/fitGroupCommand.js';
import { fitThermistorCommand } from './thermistor/thermistorCommand.js';
import { helpCommand } from './help/helpCommand.js';
import { reduceMemberCommand } from './member/memberCommand.js';
import { reduceRosetteCommand } from './rosette/rosetteCommand.js';
import { reportCommand } from './report/reportCommand.js';
import { shuntApplyCommand, shuntPlanCommand } from './shunt/shuntCommands.js';
import { uncertaintyCommand } from './uncertainty/uncertaintyCommand.js';

/**
 * Every command of `bridgework`, in the order of the help text. Only the option tables are loaded
 * here; each body is imported by its `load()` when the command runs.
 */
export const commands: readonly CommandSpec[] = Object.freeze([
  reportCommand,
  constantsCommand,
  convertCommand,
  uncertaintyCommand,
  shuntPlanCommand,
  shuntApplyCommand,
  fitCalibrationCommand,
  checkCertificateCommand,
  reduceRosetteCommand,
  reduceMemberCommand,
  fitThermistorCommand,
  fitGroupCommand,
  demoCommand,
  helpCommand,
] as unknown as CommandSpec[]);
