/**
 * Strict shape checks for records that arrive from outside (an imported
 * session file). Each check returns a list of problems, empty when the
 * record is sound; nothing from the file is used before it passes.
 */
import { isReviewFlag, type FitResult, type ReviewDecision } from '../../core/types';

const STATES = ['unreviewed', 'accepted', 'changed', 'rejected'];
const HOW_SET = ['auto', 'candidate', 'line', 'typed', 'refit'];
const GRADES = ['high', 'medium', 'low', 'none'];
const CLASSES = ['qso', 'galaxy', 'star', 'unknown'];
const STATUSES = ['ok', 'failed', 'timeout'];

type Obj = Record<string, unknown>;

function isObj(v: unknown): v is Obj {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}
const isNum = (v: unknown): v is number => typeof v === 'number';
const isStr = (v: unknown): v is string => typeof v === 'string';
/** ISO 8601 date-time that Date can read. */
function isIsoTime(v: unknown): v is string {
  return isStr(v) && /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(v) && Number.isFinite(Date.parse(v));
}

export function decisionProblems(v: unknown, where: string): string[] {
  if (!isObj(v)) return [`${where}: decision is not an object`];
  const p: string[] = [];
  if (!isStr(v.file)) p.push(`${where}: decision.file is not text`);
  if (!STATES.includes(v.state as string)) p.push(`${where}: decision.state '${String(v.state)}' is not one of ${STATES.join(', ')}`);
  if (!(v.z === null || (isNum(v.z) && Number.isFinite(v.z) && v.z > -1))) p.push(`${where}: decision.z is not a redshift or null`);
  if (!(v.zErr === null || isNum(v.zErr))) p.push(`${where}: decision.zErr is not a number or null`);
  if (!CLASSES.includes(v.class as string)) p.push(`${where}: decision.class '${String(v.class)}' is unknown`);
  if (!(v.reviewerGrade === null || GRADES.includes(v.reviewerGrade as string))) p.push(`${where}: decision.reviewerGrade is unknown`);
  if (!HOW_SET.includes(v.howSet as string)) p.push(`${where}: decision.howSet '${String(v.howSet)}' is unknown`);
  if (!isStr(v.reviewer)) p.push(`${where}: decision.reviewer is not text`);
  if (!isIsoTime(v.decidedAt)) p.push(`${where}: decision.decidedAt is not an ISO 8601 time`);
  if (!isStr(v.note)) p.push(`${where}: decision.note is not text`);
  if (v.state === 'rejected' && v.z !== null) p.push(`${where}: a rejected decision carries a redshift`);
  if (v.state !== 'rejected' && v.state !== 'unreviewed' && v.z === null) p.push(`${where}: an accepted or changed decision has no redshift`);
  if (v.flags !== undefined && !(Array.isArray(v.flags) && v.flags.every(isReviewFlag))) p.push(`${where}: decision.flags holds an unknown flag`);
  if (v.lineId !== undefined) {
    if (!isObj(v.lineId) || !isStr(v.lineId.id) || !isNum(v.lineId.observedA)) p.push(`${where}: decision.lineId is malformed`);
  }
  return p;
}

export function fitResultProblems(v: unknown, where: string): string[] {
  if (!isObj(v)) return [`${where}: result is not an object`];
  const p: string[] = [];
  if (!isStr(v.file)) p.push(`${where}: result.file is not text`);
  if (!STATUSES.includes(v.status as string)) p.push(`${where}: result.status '${String(v.status)}' is unknown`);
  if (v.error !== undefined && !isStr(v.error)) p.push(`${where}: result.error is not text`);
  for (const k of ['z', 'zErr', 'score', 'chi2Gap', 'nFeatures']) if (!isNum(v[k])) p.push(`${where}: result.${k} is not a number`);
  if (!CLASSES.includes(v.class as string)) p.push(`${where}: result.class is unknown`);
  if (!GRADES.includes(v.confidence as string)) p.push(`${where}: result.confidence is unknown`);
  if (typeof v.noiseEstimated !== 'boolean') p.push(`${where}: result.noiseEstimated is not true/false`);
  if (!isStr(v.templateSet) || !isStr(v.engineVersion)) p.push(`${where}: result provenance is missing`);
  if (!Array.isArray(v.candidates)) p.push(`${where}: result.candidates is not a list`);
  else
    v.candidates.forEach((c, i) => {
      if (!isObj(c) || !isNum(c.z) || !isNum(c.zErr) || !isNum(c.chi2) || !isNum(c.deltaChi2) || !isStr(c.family) || !CLASSES.includes(c.class as string))
        p.push(`${where}: candidate ${i + 1} is malformed`);
    });
  if (!Array.isArray(v.curves)) p.push(`${where}: result.curves is not a list`);
  else
    v.curves.forEach((c, i) => {
      if (!isObj(c) || !isStr(c.family) || !(c.z instanceof Float64Array) || !(c.deltaChi2 instanceof Float64Array) || c.z.length !== c.deltaChi2.length)
        p.push(`${where}: curve ${i + 1} is malformed`);
    });
  if (!Array.isArray(v.lines)) p.push(`${where}: result.lines is not a list`);
  else
    v.lines.forEach((l, i) => {
      if (!isObj(l) || !isStr(l.id) || !isStr(l.label) || !isNum(l.restA) || !isNum(l.z)) p.push(`${where}: line ${i + 1} is malformed`);
    });
  const input = v.input;
  if (!isObj(input) || !isNum(input.nPix) || !isNum(input.lambdaMinA) || !isNum(input.lambdaMaxA) || !isObj(input.meta) || !isStr(input.format))
    p.push(`${where}: result.input is malformed`);
  return p;
}

/** Narrowing helpers for callers that already checked the problems list. */
export function asDecision(v: unknown): ReviewDecision {
  return v as ReviewDecision;
}
export function asFitResult(v: unknown): FitResult {
  return v as FitResult;
}
