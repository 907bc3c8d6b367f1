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
  const multiComponent = {
    type: 'object',
    description: 'Bridges mapped to load components by a calibration fitted to a loading schedule',
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
          additionalProperties: false,
          required: ['unit'],
          properties: {
            unit: text("The component's unit (N, kN, N·m, kg, …)"),
            fullScale: quantity('Full scale, the scale of cross-talk and of the inverse'),
          },
        },
      },
      calibration: {
        type: 'object',
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
      },
    },
  };
  const platform = {
    type: 'object',
    description: 'Load cells summed with per-cell factors from an eccentricity (corner) test',
    additionalProperties: false,
    required: ['kind', 'bridges', 'indication', 'eccentricity'],
    properties: {
      kind: { const: 'platform', description: 'The kind of group' },
      bridges,
      indication: {
        type: 'object',
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
      eccentricity: {
        type: 'object',
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
