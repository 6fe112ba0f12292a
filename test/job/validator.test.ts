/**
 * The committed validator (src/job/validator.generated.ts, ajv's standalone code) against ajv compiling
 * schema/job.schema.json at run time: it is generated from the schema as it stands, and on every bad job
 * file of test/job/files/bad it reports the same errors, down to the schema node each error names (which
 * schema.ts places by identity).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { ErrorObject } from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
// @ts-expect-error: a plain script without type declarations
import { GENERATED, generateValidatorSource } from '../../scripts/job-validator.mjs';
import { compileValidator, jobSchema, jobValidator, pointerOf } from '../../src/job/schema.js';

const BAD = fileURLToPath(new URL('./files/bad/', import.meta.url));

/** An error with its schema nodes replaced by their pointers, so two validators compare as data. */
function plain(e: ErrorObject) {
  return {
    ...e,
    parentSchema: pointerOf(e.parentSchema as object),
    schema: typeof e.schema === 'object' && e.schema !== null ? pointerOf(e.schema) : e.schema,
  };
}

describe('generated job validator', () => {
  it('is generated from the schema file as it stands (run node scripts/job-validator.mjs when not)', () => {
    expect(readFileSync(GENERATED, 'utf8')).toBe(generateValidatorSource());
  });

  it('reports what ajv compiling the schema reports, on every bad job file', () => {
    const compiled = compileValidator(jobSchema());
    const generated = jobValidator();
    expect(generated).not.toBe(compiled);
    const files = readdirSync(BAD).filter((f) => f.endsWith('.yaml'));
    expect(files.length).toBeGreaterThan(10);
    let errors = 0;
    for (const f of files) {
      let data: unknown;
      try {
        data = parse(readFileSync(join(BAD, f), 'utf8'));
      } catch {
        continue; // a YAML syntax case never reaches the schema
      }
      const a = compiled(data);
      const b = generated(data);
      expect(b, f).toBe(a);
      expect((generated.errors ?? []).map(plain), f).toEqual((compiled.errors ?? []).map(plain));
      errors += compiled.errors?.length ?? 0;
    }
    expect(errors).toBeGreaterThan(10);
  });

  it('names schema nodes of the schema object the program reads', () => {
    const validate = jobValidator();
    expect(validate({ brief: {}, series: [] })).toBe(false);
    for (const e of validate.errors ?? []) expect(pointerOf(e.parentSchema as object)).toBeTypeOf('string');
  });
});
