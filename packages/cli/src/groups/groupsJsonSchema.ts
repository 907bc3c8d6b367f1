import { interactionTermChoices, instrumentAccuracyClasses } from '@bridgework/calibration';
import { channelNamePattern } from '../channelFile/loadChannelFile.js';
import { componentNamePattern, MAX_GROUP_BRIDGES } from './groupSpec.js';

const text = (description: string) => ({ type: 'string', description });
const quantity = (description: string) => ({
  type: ['number', 'string'],
  description: `${description} (a number in the unit given, or a text with a unit)`,
});

/**
 * The JSON Schema of a channel file's `groups` section (see `validateGroups`), for editors: the
 * same fields the command accepts, with unknown fields refused.
 *
 * @returns A JSON-serialisable schema fragment.
 */
export function groupsJsonSchema(): Record<string, unknown> {
  const bridges = {
    type: 'array',
    description: 'The bridges: names of channels of this file, in the order of the readings',
    items: { type: 'string', pattern: channelNamePattern.source },
    minItems: 1,
    maxItems: MAX_GROUP_BRIDGES,
  };
  const scheduleCalibration = {
    type: 'object',
    description: 'A calibration fitted to a loading schedule each time the file is read',
    additionalProperties: false,
    required: ['schedule'],
    properties: {
      schedule: text('The loading-schedule file (CSV), relative to the channel file'),
      interactions: {
        enum: [...interactionTermChoices],
        description: 'Second-order terms of the model (AIAA R-091); default none',
      },
      offset: { type: 'boolean', description: 'Fit a zero offset per bridge; default true' },
      independenceTolerance: {
        type: 'number',
        exclusiveMinimum: 0,
        maximum: 0.1,
        description: 'A term whose independent part is at or below this is rejected; default 1e-7',
      },
    },
  };
  const numberMatrix = (description: string) => ({
    type: 'array',
    description,
    items: { type: 'array', items: { type: 'number' } },
  });
  const storedCalibration = {
    type: 'object',
    description:
      'Stored coefficients (a sensor calibrated elsewhere, or written by bridgework fit-group); every component needs a fullScale',
    additionalProperties: false,
    required: ['terms', 'coefficients'],
    properties: {
      readingUnit: text(
        "The unit of the readings the coefficients give (mV/V, V/V, …), one for every bridge; default each bridge channel's unit",
      ),
      terms: {
        type: 'array',
        description:
          "The terms of the coefficient columns: '1', a component, 'Fx^2' (or Fx²), 'Fx*My' (or Fx·My)",
        items: { type: ['string', 'number'] },
        minItems: 1,
      },
      coefficients: {
        type: 'object',
        description:
          "Bridge → its coefficients, one per term: reading = Σ b_t·g_t(F), loads in the components' units",
        propertyNames: { pattern: channelNamePattern.source },
        additionalProperties: { type: 'array', items: { type: 'number' } },
      },
      covariance: {
        type: 'object',
        description: "The fit's covariance: Cov(b_i, b_k) = Σ_ik·(AᵀA)⁻¹",
        additionalProperties: false,
        required: ['terms', 'readings'],
        properties: {
          terms: numberMatrix('(AᵀA)⁻¹ over the terms (T×T)'),
          readings: numberMatrix('Σ over the readings (N×N), in the reading unit squared'),
          degreesOfFreedom: {
            type: 'number',
            exclusiveMinimum: 0,
            description: 'Degrees of freedom of Σ; default infinite',
          },
        },
      },
      source: {
        type: 'object',
        description: 'Where the coefficients came from',
        additionalProperties: false,
        properties: {
          schedule: text('The loading-schedule file, as given to the command'),
          scheduleSha256: text("SHA-256 of the schedule file's bytes"),
          points: { type: 'integer', minimum: 1, description: 'Its number of load points' },
          interactions: {
            enum: [...interactionTermChoices],
            description: 'The second-order terms the fit was allowed',
          },
          date: text('When the calibration was made (ISO 8601 date or date and time)'),
          note: text('Who, with what, why (free text)'),
        },
      },
    },
  };
  const multiComponent = {
    type: 'object',
    description:
      'Bridges mapped to load components by a calibration (fitted to a loading schedule, or stored coefficients)',
    additionalProperties: false,
    required: ['bridges', 'components', 'calibration'],
    properties: {
      kind: { const: 'multi-component', description: 'The kind of group (the default)' },
      bridges,
      components: {
        type: 'object',
        description: 'The load components: name → { unit, fullScale }',
        minProperties: 1,
        propertyNames: { pattern: componentNamePattern.source },
        additionalProperties: {
          type: 'object',
          description: 'One load component: its unit and full scale',
          additionalProperties: false,
          required: ['unit'],
          properties: {
            unit: text("The component's unit (N, kN, N·m, kg, …)"),
            fullScale: quantity('Full scale, the scale of cross-talk and of the inverse'),
          },
        },
      },
      calibration: { oneOf: [scheduleCalibration, storedCalibration] },
    },
  };
  const platform = {
    type: 'object',
    description: 'Load cells summed with per-cell factors from an eccentricity (corner) test',
    additionalProperties: false,
    required: ['kind', 'bridges', 'indication', 'eccentricity'],
    properties: {
      kind: { const: 'platform', description: 'The kind of group' },
      bridges: { ...bridges, description: 'The load cells: names of channels of this file', minItems: 2 },
      indication: {
        type: 'object',
        description: "The platform's indication: its name (a data column's) and unit",
        additionalProperties: false,
        required: ['name', 'unit'],
        properties: {
          name: {
            type: 'string',
            pattern: componentNamePattern.source,
            description: "The indication's name",
          },
          unit: text("The indication's unit (kg, t, N, …)"),
        },
      },
      summing: {
        type: 'object',
        description:
          'An analog summing junction whose trim resistors the eccentricity test sets (without it the cells are summed digitally with factors)',
        additionalProperties: false,
        required: ['cellOhms'],
        properties: {
          cellOhms: {
            type: ['number', 'string', 'array'],
            items: { type: ['number', 'string'] },
            description:
              "Each cell's bridge resistance: one for every cell, or a list (a number in Ω, or a text with a unit)",
          },
          trimPlacement: {
            enum: ['both-excitation', 'positive-excitation'],
            description: "Where each cell's trim sits: split between +E and −E (default), or all in +E",
          },
          summingOhms: quantity(
            "The resistor from each cell's +S and −S to the buses; default 0 (paralleled directly)",
          ),
          meterOhms: {
            type: ['number', 'string'],
            description: "The indicator's input resistance across the buses; default 'open'",
          },
        },
      },
      eccentricity: {
        type: 'object',
        description: 'The eccentricity (corner) test that sets the cell factors, and the OIML R 76 check',
        additionalProperties: false,
        required: ['test', 'testLoad', 'accuracyClass', 'maxCapacity', 'verificationInterval'],
        properties: {
          test: text('The eccentricity test file (CSV), relative to the channel file'),
          testLoad: quantity('The test load'),
          checkPositions: {
            type: 'array',
            items: { type: 'string' },
            description: 'Positions of the test file that only check the factors',
          },
          accuracyClass: { enum: [...instrumentAccuracyClasses], description: 'OIML R 76 accuracy class' },
          maxCapacity: quantity('Max, the maximum capacity'),
          verificationInterval: quantity('e, the verification scale interval'),
          supportPoints: {
            type: 'integer',
            minimum: 1,
            maximum: 64,
            description: 'Points of support; default 4',
          },
        },
      },
    },
  };
  return {
    type: 'object',
    description: 'Multi-bridge groups: group name → multi-component sensor or platform',
    minProperties: 1,
    propertyNames: { pattern: channelNamePattern.source },
    additionalProperties: {
      oneOf: [{ ...platform }, { ...multiComponent }],
    },
  };
}
