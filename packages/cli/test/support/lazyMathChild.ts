/** Child process: prints whether parsing plain numbers loads mathjs, and whether a unit does. */
import { isMathLoaded } from '../../src/internal/mathUnits.js';
import { parseQuantity } from '../../src/units/parseQuantity.js';

const plain = [parseQuantity('350', 'ohm'), parseQuantity(' -2.5e-3 ', 'V/V'), parseQuantity('25', 'degC')];
const afterPlain = isMathLoaded();
const withUnit = parseQuantity('350 ohm', 'ohm');
process.stdout.write(`${JSON.stringify({ plain, afterPlain, withUnit, afterUnit: isMathLoaded() })}\n`);
