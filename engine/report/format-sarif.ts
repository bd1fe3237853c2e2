/**
 * The report as a SARIF 2.1.0 log (OASIS Static Analysis Results Interchange
 * Format), for code-scanning services and editors: one run, the rule
 * catalogue as the driver's rules, one result per finding located at the
 * first element it names (the others as related locations).
 *
 * Columns are counted in UTF-16 code units, as the reader counts them.
 */
import { createHash } from 'node:crypto';
import { ALL_RULES } from '../rules/index.js';
import type { Finding, Report, Severity } from './types.js';

export const SARIF_VERSION = '2.1.0';
export const SARIF_SCHEMA_URI = 'https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json';

export type SarifLevel = 'error' | 'warning' | 'note';
type PropertyValue = string | number | boolean | null | PropertyValue[] | { [key: string]: PropertyValue };

export interface SarifMessage {
  text: string;
}

export interface SarifRegion {
  startLine: number;
  startColumn?: number;
}

export interface SarifLocation {
  id?: number;
  physicalLocation: {
    artifactLocation: { uri: string; index?: number };
    region?: SarifRegion;
  };
  message?: SarifMessage;
}

export interface SarifRule {
  id: string;
  name: string;
  shortDescription: SarifMessage;
  fullDescription?: SarifMessage;
  defaultConfiguration: { level: SarifLevel };
  properties: { source: string; family: string; fix?: string; tags: string[] };
}

export interface SarifResult {
  ruleId: string;
  ruleIndex: number;
  level: SarifLevel;
  message: SarifMessage;
  locations: SarifLocation[];
  relatedLocations?: SarifLocation[];
  partialFingerprints: Record<string, string>;
  properties?: { measures: { [key: string]: PropertyValue }; fix?: string };
}

export interface SarifLog {
  $schema: string;
  version: typeof SARIF_VERSION;
  runs: {
    tool: {
      driver: {
        name: string;
        version: string;
        semanticVersion: string;
        rules: SarifRule[];
      };
    };
    columnKind: 'utf16CodeUnits';
    artifacts: { location: { uri: string } }[];
    results: SarifResult[];
  }[];
}

/** Findings plumbline itself writes, outside the rule catalogue. */
const OWN_RULES: readonly { id: string; severity: Severity; rationale: string; source: string }[] = [
  {
    id: 'plumbline.unreadable',
    severity: 'error',
    rationale: 'The file could not be read as an SVG document, so nothing in it could be checked.',
    source: 'W3C SVG 1.1 / SVG 2 and XML 1.0 well-formedness',
  },
  {
    id: 'plumbline.internal',
    severity: 'note',
    rationale: 'A check could not run on this file; its result is missing from the report.',
    source: 'plumbline',
  },
];

/**
 * A path as a URI reference: forward slashes, each segment percent-encoded
 * (so spaces, `#`, `?` and `%` stay part of the name). Relative paths stay
 * relative; absolute POSIX paths and drive-letter paths become `file:` URIs.
 */
export function pathToUriReference(p: string): string {
  const slashed = p.replace(/\\/g, '/');
  const drive = /^([A-Za-z]):\//.exec(slashed);
  const encode = (rest: string): string => rest.split('/').map((seg) => encodeURIComponent(seg)).join('/');
  if (drive) return `file:///${drive[1]}:/${encode(slashed.slice(3))}`;
  if (slashed.startsWith('/')) return `file://${encode(slashed)}`;
  return encode(slashed);
}

function toProperty(v: unknown): PropertyValue {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return Number.isFinite(v) ? v : String(v);
  if (typeof v === 'string' || typeof v === 'boolean') return v;
  if (Array.isArray(v)) return v.map(toProperty);
  if (typeof v === 'object') {
    const out: { [key: string]: PropertyValue } = {};
    for (const [k, x] of Object.entries(v as Record<string, unknown>)) out[k] = toProperty(x);
    return out;
  }
  return String(v);
}

function fingerprint(path: string, x: Finding): string {
  const e = x.elements[0];
  const where = e ? (e.id ? `#${e.id}` : `${e.line}:${e.column}`) : '';
  return createHash('sha256').update(`${x.rule}\u0000${path}\u0000${where}`).digest('hex').slice(0, 32);
}

function location(uri: string, index: number, e: Finding['elements'][number]): SarifLocation {
  const region: SarifRegion = { startLine: Math.max(1, Math.trunc(e.line)) };
  if (Number.isFinite(e.column) && e.column >= 1) region.startColumn = Math.trunc(e.column);
  return { physicalLocation: { artifactLocation: { uri, index }, region } };
}

/** The report as a SARIF 2.1.0 log object (serialise with JSON.stringify). */
export function formatSarif(report: Report): SarifLog {
  const rules: SarifRule[] = [
    ...ALL_RULES.map((r) => ({
      id: r.id,
      name: r.id,
      shortDescription: { text: r.rationale },
      defaultConfiguration: { level: r.severity },
      properties: { source: r.source, family: r.family, tags: [r.family], ...(r.fix ? { fix: r.fix } : {}) },
    })),
    ...OWN_RULES.map((r) => ({
      id: r.id,
      name: r.id,
      shortDescription: { text: r.rationale },
      defaultConfiguration: { level: r.severity },
      properties: { source: r.source, family: 'plumbline', tags: ['plumbline'] },
    })),
  ];
  const ruleIndex = new Map(rules.map((r, i) => [r.id, i]));
  const artifacts: { location: { uri: string } }[] = [];
  const results: SarifResult[] = [];
  for (const f of report.files) {
    const uri = pathToUriReference(f.path);
    const index = artifacts.length;
    artifacts.push({ location: { uri } });
    for (const x of f.findings) {
      let idx = ruleIndex.get(x.rule);
      if (idx === undefined) {
        // A rule the catalogue does not list (a newer engine): describe it by its finding.
        idx = rules.length;
        rules.push({
          id: x.rule,
          name: x.rule,
          shortDescription: { text: x.rule },
          defaultConfiguration: { level: x.severity },
          properties: { source: 'plumbline', family: x.rule.split('.')[0] ?? 'plumbline', tags: [] },
        });
        ruleIndex.set(x.rule, idx);
      }
      const [first, ...rest] = x.elements;
      const locations = first ? [location(uri, index, first)] : [{ physicalLocation: { artifactLocation: { uri, index } } }];
      const result: SarifResult = {
        ruleId: x.rule,
        ruleIndex: idx,
        level: x.severity,
        message: { text: x.message },
        locations,
        partialFingerprints: { 'plumblineFinding/v1': fingerprint(f.path, x) },
      };
      if (rest.length > 0) result.relatedLocations = rest.map((e, k) => ({ id: k + 1, ...location(uri, index, e) }));
      const measures = toProperty(x.measures);
      if (measures && typeof measures === 'object' && !Array.isArray(measures) && Object.keys(measures).length > 0) {
        result.properties = { measures, ...(x.fix ? { fix: x.fix } : {}) };
      } else if (x.fix) {
        result.properties = { measures: {}, fix: x.fix };
      }
      results.push(result);
    }
  }
  return {
    $schema: SARIF_SCHEMA_URI,
    version: SARIF_VERSION,
    runs: [
      {
        tool: { driver: { name: 'plumbline', version: report.plumbline, semanticVersion: report.plumbline, rules } },
        columnKind: 'utf16CodeUnits',
        artifacts,
        results,
      },
    ],
  };
}
