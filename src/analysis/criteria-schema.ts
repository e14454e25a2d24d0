/**
 * JSON Schema (draft 2020-12 subset understood by ajv's default draft-07 mode) of a criteria file.
 * Kept as a TS object so the loader finds it from src/ and dist/src/ alike. Every field is optional:
 * a file overrides DEFAULT_CRITERIA field by field, and flags override the file.
 *
 * @example
 * { "drop": 4, "window": 300,
 *   "perSeries": [ { "pattern": "res_T", "drop": 6 }, { "pattern": "cfl*", "ignore": true } ] }
 */
import { MIN_WINDOW } from './validate-criteria.js';

export const CRITERIA_SCHEMA = {
  $id: 'https://settle.invalid/criteria.schema.json',
  title: 'settle convergence criteria',
  type: 'object',
  additionalProperties: false,
  properties: {
    $schema: { type: 'string' },
    description: { type: 'string' },
    drop: { type: 'number', exclusiveMinimum: 0, description: 'decades a residual must fall from its peak' },
    target: { type: 'number', exclusiveMinimum: 0, description: 'absolute residual target' },
    qoiTol: { type: 'number', exclusiveMinimum: 0, exclusiveMaximum: 1, description: 'relative 95 % half-width a quantity must settle to' },
    window: { type: 'integer', minimum: MIN_WINDOW, description: 'trailing window in iterations (at least 5: a trend needs 5 points)' },
    series: { type: 'array', items: { type: 'string', minLength: 1 }, description: 'globs of the series that count' },
    startup: { type: 'integer', minimum: 0, description: 'iterations not judged at the start and after a restart' },
    confirm: { type: 'integer', minimum: 1, description: 'consecutive evaluations a stopping verdict must hold' },
    perSeries: {
      type: 'array',
      items: {
        type: 'object',
        additionalProperties: false,
        required: ['pattern'],
        properties: {
          pattern: { type: 'string', minLength: 1 },
          drop: { type: 'number', exclusiveMinimum: 0 },
          target: { type: 'number', exclusiveMinimum: 0 },
          qoiTol: { type: 'number', exclusiveMinimum: 0, exclusiveMaximum: 1 },
          ignore: { type: 'boolean' },
        },
      },
    },
  },
} as const;
