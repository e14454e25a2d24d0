import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import AjvModule from 'ajv';
import { validateParserSpec } from '../../src/parse/validate-parser-spec.js';

const parsers = resolve('parsers');
const schema = JSON.parse(readFileSync(join(parsers, 'parser-spec.schema.json'), 'utf8')) as Record<string, unknown>;

describe('parsers/parser-spec.schema.json', () => {
  it('is a valid JSON Schema (draft-07, checked by ajv in strict mode; "required" inside oneOf names the parent\'s properties)', () => {
    const ajv = new AjvModule.default({ strict: true, strictRequired: false });
    expect(() => ajv.compile(schema)).not.toThrow();
    expect(schema.$schema).toBe('http://json-schema.org/draft-07/schema#');
  });

  it('every built-in spec names the schema for editors and passes it', () => {
    const ajv = new AjvModule.default({ allErrors: true, strict: false });
    const validate = ajv.compile(schema);
    const files = readdirSync(parsers).filter((f) => f.endsWith('.json') && f !== 'parser-spec.schema.json');
    expect(files).toHaveLength(5);
    for (const file of files) {
      const spec = JSON.parse(readFileSync(join(parsers, file), 'utf8')) as Record<string, unknown>;
      expect(spec.$schema, file).toBe('./parser-spec.schema.json');
      expect(validate(spec), `${file}: ${JSON.stringify(validate.errors)}`).toBe(true);
      expect(`${spec.id as string}.json`).toBe(file);
    }
  });

  it('every built-in spec passes the full check loadParserSpecs gives user specs (schema and semantic rules), since start-up does not re-check them', () => {
    const files = readdirSync(parsers).filter((f) => f.endsWith('.json') && f !== 'parser-spec.schema.json');
    for (const file of files) {
      const spec = JSON.parse(readFileSync(join(parsers, file), 'utf8')) as unknown;
      expect(validateParserSpec(spec, schema), file).toEqual([]);
    }
    // The check can fail: a built-in with a broken pattern is reported.
    const broken = JSON.parse(readFileSync(join(parsers, 'settle-block.json'), 'utf8')) as { lines: { rules: { match: string }[] } };
    broken.lines.rules[0].match = '^=== iteration (?<iteration>[0-9]+ ===';
    expect(validateParserSpec(broken, schema).join('\n')).toMatch(/lines\.rules\[0\]\.match/);
  });
});
