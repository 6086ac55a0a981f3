// A typed reading, parsed and judged: the one way the server, the tablet's preview, the demo data
// and the benchmarks turn what a technician typed into a value and a verdict. The test-lead null
// is subtracted only when one is given (no default), and is checked here like the reading itself.

import {
  evaluateReading,
  NoRuleError,
  ReadingInputError,
  type EquipmentKind,
  type LimitProfile,
  type TestKind,
  type Verdict,
} from './limits';
import { formatOhm, LEAD_NULL_MAX_OHM, parseReading, roundSignificant } from './units';

export interface TypedReadingContext {
  profile: LimitProfile;
  equipmentKind: EquipmentKind;
  testKind: TestKind;
  /** `A`, `A-B` or `piste`, as the step says. */
  conductors: string;
  lengthM?: number | null | undefined;
  temperatureC?: number | null | undefined;
}

export type JudgedReading =
  | {
      ok: true;
      /** After the lead null was subtracted; null when over range. */
      valueOhm: number | null;
      overRange: boolean;
      /** The test-lead null subtracted (null when none was given). */
      leadNullOhm: number | null;
      /** The corrected value with its unit, e.g. `0.4 Ω` or `OL`. */
      display: string;
      verdict: Verdict;
    }
  | {
      ok: false;
      /** The request field the refusal is about: `value`, `leadNull`, `stepId`, `temperatureC`, … */
      field: string;
      code: string;
      message: string;
    };

/**
 * Parses `text` as a resistance, subtracts the test-lead null if one is given (it must be at most
 * LEAD_NULL_MAX_OHM and not above the reading) and judges it against the profile. Never throws for
 * bad input: a refusal names the field and says why.
 */
export function judgeTypedReading(text: string, ctx: TypedReadingContext, leadNullOhm: number | null = null): JudgedReading {
  if (leadNullOhm !== null) {
    const lead = checkLeadNullValue(leadNullOhm);
    if (lead) return { ok: false, field: 'leadNullId', code: 'bad-lead-null', message: lead };
  }
  const parsed = parseReading(text, 'resistance', leadNullOhm === null ? undefined : { leadOffsetOhm: leadNullOhm });
  if (!parsed.ok) return { ok: false, field: 'value', code: 'invalid-reading', message: parsed.message };
  try {
    const verdict = evaluateReading({ ...ctx, valueOhm: parsed.value, overRange: parsed.overRange });
    return { ok: true, valueOhm: parsed.value, overRange: parsed.overRange, leadNullOhm, display: parsed.display, verdict };
  } catch (err) {
    if (err instanceof NoRuleError) return { ok: false, field: 'stepId', code: err.code, message: err.message };
    if (err instanceof ReadingInputError) return { ok: false, field: err.field, code: err.code, message: err.message };
    throw err;
  }
}

/** Why a lead null value cannot be used, or null when it can. */
function checkLeadNullValue(valueOhm: number): string | null {
  if (!Number.isFinite(valueOhm) || valueOhm < 0) return `A test-lead null must be 0 Ω or more (got ${String(valueOhm)}).`;
  if (valueOhm > LEAD_NULL_MAX_OHM) {
    return `The test leads read ${formatOhm(valueOhm)} with their tips touching: more than ${formatOhm(LEAD_NULL_MAX_OHM)} means the leads or their probes are worn. Replace them, then null the leads again.`;
  }
  return null;
}

export type ParsedLeadNull = { ok: true; valueOhm: number; display: string } | { ok: false; message: string };

/** What the leads read with their tips touching, as typed: a resistance of at most LEAD_NULL_MAX_OHM. */
export function parseLeadNull(text: string): ParsedLeadNull {
  const p = parseReading(text, 'resistance');
  if (!p.ok) return { ok: false, message: p.message };
  if (p.overRange || p.value === null) {
    return { ok: false, message: 'Over range with the tips touching: a lead or a probe is broken. Replace it, then null the leads again.' };
  }
  const refused = checkLeadNullValue(p.value);
  return refused ? { ok: false, message: refused } : { ok: true, valueOhm: p.value, display: p.display };
}

/** A stored reading's value as people should read it: with its unit, and what the lead null took off. */
export interface ReadingValueView {
  /** The value that was judged: `0.4 Ω`, `OL`. */
  value: string;
  /** What the meter showed, with its unit (`0.5 Ω`), when a lead null changed the figure; else null. */
  typed: string | null;
  /** The lead null subtracted (`0.1 Ω`), when there was one above 0 Ω. */
  leadNull: string | null;
}

export function readingValueView(r: {
  valueText: string;
  valueOhm: number | null;
  overRange: boolean;
  leadOffsetOhm: number | null;
}): ReadingValueView {
  if (r.overRange) return { value: 'OL', typed: null, leadNull: null };
  if (r.valueOhm === null) return { value: r.valueText, typed: null, leadNull: null };
  const value = formatOhm(r.valueOhm);
  if (!r.leadOffsetOhm) return { value, typed: null, leadNull: null };
  const typed = parseReading(r.valueText, 'resistance');
  const typedOhm = typed.ok && typed.value !== null ? typed.value : roundSignificant(r.valueOhm + r.leadOffsetOhm, 12);
  // On 54 MΩ a 0.05 Ω null changes no figure shown: saying it would only add noise.
  if (formatOhm(typedOhm) === value) return { value, typed: null, leadNull: null };
  return { value, typed: formatOhm(typedOhm), leadNull: formatOhm(r.leadOffsetOhm) };
}

/** `0.4 Ω (typed 0.5 Ω − 0.1 Ω lead null)`, or just `0.4 Ω`. */
export function describeReadingValue(r: Parameters<typeof readingValueView>[0]): string {
  const v = readingValueView(r);
  return v.typed ? `${v.value} (typed ${v.typed} − ${v.leadNull} lead null)` : v.value;
}
