/**
 * A validator for SARIF 2.1.0 logs. The schema is the SARIF 2.1.0 JSON schema
 * (version "2.1.0-rtm.5", JSON Schema draft-04) as shipped in the npm package
 * @microsoft/jest-sarif 1.0.0-beta.0 (lib/schemas/sarif-2.1.0-rtm.5.json);
 * draft-04 is checked with ajv-draft-04, formats (uri, uri-reference, ...)
 * with ajv-formats.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import AjvDraft04 from 'ajv-draft-04';
import formatsPlugin from 'ajv-formats';

// Both are CommonJS modules whose export is under `default`.
const Ajv = AjvDraft04.default;
const addFormats = formatsPlugin.default;

const require = createRequire(import.meta.url);

export const SARIF_SCHEMA_FILE = join(dirname(require.resolve('@microsoft/jest-sarif/package.json')), 'lib/schemas/sarif-2.1.0-rtm.5.json');

let validate: (((data: unknown) => boolean) & { errors?: unknown }) | undefined;

/** Schema errors of a SARIF log, as readable lines (empty when valid). */
export function sarifSchemaErrors(log: unknown): string[] {
  if (validate === undefined) {
    const schema = JSON.parse(readFileSync(SARIF_SCHEMA_FILE, 'utf8')) as Record<string, unknown>;
    // unicodeRegExp off: the schema's `language` pattern has a stray `]`, legal only without the u flag.
    const ajv = new Ajv({ allErrors: true, strict: false, unicodeRegExp: false });
    addFormats(ajv);
    validate = ajv.compile(schema);
  }
  const v = validate;
  if (v(log)) return [];
  const errors = (v.errors ?? []) as { instancePath?: string; message?: string; params?: unknown }[];
  return errors.map((e) => `${e.instancePath || '/'} ${e.message ?? ''} ${JSON.stringify(e.params ?? {})}`);
}
