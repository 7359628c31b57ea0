import { analysisSettingsSchema, applyAnalysisRequestSchema } from '@shared/contracts/analyses';
import { z } from 'zod';
import {
  APPLY_MESSAGE_MAX_LENGTH,
  EXPRESSION_MAX_LENGTH,
  SETTING_RANGES,
  type SettingKey,
  lambdaOrderProblem,
  optionalNumber,
  rangeProblem,
  rangeText,
} from './analysis-setting-ranges';

/** A JSON-schema node, as far as ranges go. */
interface JsonNode {
  type?: string;
  minimum?: number;
  exclusiveMinimum?: number;
  maximum?: number;
  maxLength?: number;
  properties?: Record<string, JsonNode>;
  items?: { oneOf?: JsonNode[] };
}

const settingsJson = z.toJSONSchema(analysisSettingsSchema) as JsonNode;
const applyJson = z.toJSONSchema(applyAnalysisRequestSchema) as JsonNode;

/** The JSON-schema node of a setting key, found in the contract. */
function contractNode(key: SettingKey): JsonNode | undefined {
  const [head, field] = key.split('.') as [string, string | undefined];
  if (head === 'apply') return applyJson.properties?.[field ?? ''];
  if (head === 'delay') return settingsJson.properties?.['delay']?.properties?.[field ?? ''];
  if (field === undefined) return settingsJson.properties?.[head];
  const rule = settingsJson.properties?.['filters']?.items?.oneOf?.find(
    (option) => (option.properties?.['kind'] as { const?: string } | undefined)?.const === head,
  );
  return rule?.properties?.[field];
}

describe('SETTING_RANGES', () => {
  it.each(Object.keys(SETTING_RANGES) as SettingKey[])(
    'When %s is compared with the API contract, then its range agrees',
    (key) => {
      const node = contractNode(key);
      const range = SETTING_RANGES[key];
      expect(node).toBeDefined();
      expect({
        min: node?.exclusiveMinimum ?? node?.minimum,
        isMinExclusive: node?.exclusiveMinimum !== undefined,
        max: node?.maximum,
        isInteger: node?.type === 'integer',
      }).toEqual({
        min: range.min,
        isMinExclusive: 'isMinExclusive' in range && range.isMinExclusive === true,
        max: range.max,
        isInteger: 'isInteger' in range && range.isInteger === true,
      });
    },
  );

  it('When the text limits are compared with the contract, then they agree', () => {
    const filters = settingsJson.properties?.['filters']?.items?.oneOf ?? [];
    const expression = filters.find(
      (o) => (o.properties?.['kind'] as { const?: string }).const === 'expression',
    );
    expect(expression?.properties?.['source']?.maxLength).toBe(EXPRESSION_MAX_LENGTH);
    expect(applyJson.properties?.['message']?.maxLength).toBe(APPLY_MESSAGE_MAX_LENGTH);
  });
});

describe('rangeText and rangeProblem', () => {
  it.each<[SettingKey, number | null, string | null]>([
    ['stepFraction', 0.5, null],
    ['stepFraction', 1, null],
    ['stepFraction', 0, 'Step fraction must be above 0 and at most 1.'],
    ['stepFraction', 1.2, 'Step fraction must be above 0 and at most 1.'],
    ['stepFraction', null, 'Step fraction: enter above 0 and at most 1.'],
    ['delay.tau0S', 0, null],
    ['delay.tau0S', 2.5, 'Delay τ₀ must be from 0 to 2 s.'],
    ['warmUp.minEctC', -41, 'Lowest coolant temperature must be from -40 to 130 °C.'],
    ['apply.maxReach', 2.5, 'Fill reach must be a whole number from 0 to 100 cells.'],
    ['apply.maxReach', 100, null],
    ['leanLoadKpa', Number.NaN, 'Under load from: enter from 0 to 500 kPa.'],
  ])('When %s is %p, then the problem is %p', (key, value, problem) => {
    expect(rangeProblem(SETTING_RANGES[key], value)).toBe(problem);
  });

  it('When a range is exclusive at its low end, then the text says "above"', () => {
    expect(rangeText(SETTING_RANGES.maxSpread)).toBe('above 0 and at most 1');
  });

  it.each([
    [0.65, 1.3, null],
    [1.3, 1.3, 'Highest lambda must be above lowest lambda.'],
    [1.3, 0.9, 'Highest lambda must be above lowest lambda.'],
    [null, 0.9, null],
  ])('When the lambda range is %p–%p, then the problem is %p', (min, max, problem) => {
    expect(lambdaOrderProblem(min, max)).toBe(problem);
  });
});

describe('optionalNumber', () => {
  it.each([
    [3, { maxReach: 3 }],
    [0, { maxReach: 0 }],
    [null, {}],
  ])('When the value is %p, then the field is %j', (value, field) => {
    expect(optionalNumber('maxReach', value)).toEqual(field);
  });
});
