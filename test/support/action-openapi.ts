/**
 * Checks HTTP requests against GitHub's published OpenAPI description of its
 * REST API (api.github.com.json from the npm package @octokit/openapi): the
 * path must match a path template, the method must be an operation of it,
 * path and query parameters must be declared and valid, and a JSON body must
 * validate against the operation's request-body schema (ajv).
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { Ajv, type ValidateFunction } from 'ajv';

const require = createRequire(import.meta.url);
export const OPENAPI_FILE = require.resolve('@octokit/openapi/generated/api.github.com.json');

interface Parameter {
  name: string;
  in: 'path' | 'query' | 'header' | 'cookie';
  required?: boolean;
  schema?: Record<string, unknown>;
}
type Ref = { $ref: string };
interface Operation {
  operationId?: string;
  parameters?: (Parameter | Ref)[];
  requestBody?: { content?: Record<string, { schema?: Record<string, unknown> }> } | Ref;
}
interface Spec {
  paths: Record<string, Record<string, Operation | (Parameter | Ref)[]>>;
  components: Record<string, Record<string, unknown>>;
}

let spec: Spec | undefined;
let ajv: Ajv | undefined;
const compiled = new Map<string, ValidateFunction>();
let templates: { template: string; re: RegExp; names: string[]; literals: number }[] = [];

function load(): Spec {
  if (!spec) {
    spec = JSON.parse(readFileSync(OPENAPI_FILE, 'utf8')) as Spec;
    ajv = new Ajv({ strict: false, allErrors: true });
    // OpenAPI 3.0 integer formats (OpenAPI Specification 3.0.3, 4.4 Data Types).
    ajv.addFormat('int32', { type: 'number', validate: (n: number) => Number.isInteger(n) && n >= -(2 ** 31) && n < 2 ** 31 });
    ajv.addFormat('int64', { type: 'number', validate: (n: number) => Number.isInteger(n) });
    // The whole description as one schema document, so `#/components/...` references resolve.
    ajv.addSchema({ $id: 'github-rest', components: spec.components }, 'github-rest');
    templates = Object.keys(spec.paths).map((t) => {
      const names: string[] = [];
      const re = new RegExp(
        '^' +
          t
            .split('/')
            .map((seg) => {
              const m = /^\{([^}]+)\}$/.exec(seg);
              if (m) {
                names.push(m[1]!);
                return '([^/]+)';
              }
              return seg.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
            })
            .join('/') +
          '$',
      );
      return { template: t, re, names, literals: t.split('/').filter((s) => s && !s.startsWith('{')).length };
    });
  }
  return spec;
}

function deref<T>(x: T | Ref): T {
  if (x && typeof x === 'object' && '$ref' in x) {
    const parts = (x as Ref).$ref.replace(/^#\//, '').split('/');
    let cur: unknown = load();
    for (const p of parts) cur = (cur as Record<string, unknown>)[p];
    return cur as T;
  }
  return x as T;
}

function rewriteRefs(schema: unknown): unknown {
  if (Array.isArray(schema)) return schema.map(rewriteRefs);
  if (schema && typeof schema === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(schema)) out[k] = k === '$ref' && typeof v === 'string' && v.startsWith('#/') ? `github-rest${v}` : rewriteRefs(v);
    return out;
  }
  return schema;
}

function validator(key: string, schema: Record<string, unknown>): ValidateFunction {
  const known = compiled.get(key);
  if (known) return known;
  const v = ajv!.compile(rewriteRefs(schema) as Record<string, unknown>);
  compiled.set(key, v);
  return v;
}

function coerce(value: string, schema: Record<string, unknown> | undefined): unknown {
  const type = schema?.type;
  if ((type === 'integer' || type === 'number') && /^-?\d+(\.\d+)?$/.test(value)) return Number(value);
  if (type === 'boolean' && (value === 'true' || value === 'false')) return value === 'true';
  return value;
}

/** What is wrong with a request by the OpenAPI description (empty when nothing). */
export function openApiProblems(method: string, url: string, body: string | null): string[] {
  const s = load();
  const u = new URL(url, 'http://api.invalid');
  const path = decodeURIComponent(u.pathname);
  const matches = templates.filter((t) => t.re.test(u.pathname)).sort((a, b) => b.literals - a.literals);
  const t = matches[0];
  if (!t) return [`${method} ${path}: no path template matches`];
  const item = s.paths[t.template]!;
  const op = item[method.toLowerCase()] as Operation | undefined;
  if (!op || Array.isArray(op)) return [`${method} ${t.template}: no such operation`];
  const problems: string[] = [];
  const params = [...((item.parameters as (Parameter | Ref)[] | undefined) ?? []), ...(op.parameters ?? [])].map((p) => deref<Parameter>(p));
  const values = t.re.exec(u.pathname)!.slice(1);
  t.names.forEach((name, i) => {
    const p = params.find((x) => x.in === 'path' && x.name === name);
    if (!p) return problems.push(`${t.template}: path parameter ${name} is not declared`);
    if (p.schema && !validator(`${t.template} path ${name}`, p.schema)(coerce(decodeURIComponent(values[i]!), p.schema))) {
      problems.push(`${t.template}: path parameter ${name}=${values[i]} is invalid`);
    }
    return undefined;
  });
  for (const [name, value] of u.searchParams) {
    const p = params.find((x) => x.in === 'query' && x.name === name);
    if (!p) {
      problems.push(`${method} ${t.template}: query parameter ${name} is not declared`);
      continue;
    }
    if (p.schema && !validator(`${t.template} ${method} query ${name}`, p.schema)(coerce(value, p.schema))) problems.push(`${method} ${t.template}: query ${name}=${value} is invalid`);
  }
  for (const p of params) if (p.in === 'query' && p.required && !u.searchParams.has(p.name)) problems.push(`${method} ${t.template}: required query ${p.name} missing`);
  const rb = op.requestBody ? deref(op.requestBody) : undefined;
  const schema = rb?.content?.['application/json']?.schema;
  if (body !== null && body !== '') {
    if (!schema) problems.push(`${method} ${t.template}: the operation takes no JSON body`);
    else {
      let parsed: unknown;
      try {
        parsed = JSON.parse(body);
      } catch {
        return [...problems, `${method} ${t.template}: body is not JSON`];
      }
      const v = validator(`${t.template} ${method} body`, schema);
      if (!v(parsed)) problems.push(`${method} ${t.template}: body invalid: ${ajv!.errorsText(v.errors)}`);
    }
  } else if (schema && (rb as { required?: boolean }).required) problems.push(`${method} ${t.template}: required body missing`);
  return problems;
}

/** The operation id a request maps to (for messages). */
export function operationOf(method: string, url: string): string | null {
  load();
  const u = new URL(url, 'http://api.invalid');
  const t = templates.filter((x) => x.re.test(u.pathname)).sort((a, b) => b.literals - a.literals)[0];
  const op = t ? (spec!.paths[t.template]![method.toLowerCase()] as Operation | undefined) : undefined;
  return op?.operationId ?? null;
}
