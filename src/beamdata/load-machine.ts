import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import type {
  ElectronApplicatorData,
  ElectronBeamModel,
  Issue,
  MachineModel,
  PhotonBeamModel,
  Result,
  TableAxis,
  TableLookup,
  WedgeData,
} from '../model/index.js';
import { type CsvTable, parseCsvTable } from './csv-table.js';
import { type ElectronBeamEntry, Manifest, type PhotonBeamEntry } from './manifest-schema.js';
import { nearestKey } from './nearest-key.js';
import { type ClampAllowance, makeTableLookup } from './table-lookup.js';

/** One loaded table with what the validator needs: its CSV (with positions) and its lookup. */
export interface LoadedTable {
  readonly beamId: string;
  readonly quantity: string;
  readonly csv: CsvTable;
  readonly lookup: TableLookup;
  /** Multiplier from the file's value unit to the engine's (100 for a PDD given as a fraction). */
  readonly valueScale: number;
  /** The file's bytes as read and parsed. */
  readonly bytes: Uint8Array;
}

export interface LoadedMachine {
  readonly machine: MachineModel;
  readonly manifest: Manifest;
  readonly manifestFile: string;
  readonly tables: readonly LoadedTable[];
  /** The manifest's bytes as read: with each table's, what the data's SHA-256 is taken over (never a second read). */
  readonly manifestBytes: Uint8Array;
}

/** Axis units to the engine's: lengths to cm; angles stay in degrees. */
const TO_CM = { cm: 1, mm: 0.1, deg: 1 } as const;

/**
 * Reads a machine manifest and every table it names into a `MachineModel` of ready lookups.
 * Problems come back as issues with file:line:column; nothing half-loaded is returned.
 */
export function loadMachine(manifestFile: string): Result<LoadedMachine> {
  const issues: Issue[] = [];
  let json: unknown;
  let manifestBytes: Uint8Array = new Uint8Array();
  try {
    const bytes = readFileSync(manifestFile);
    manifestBytes = bytes;
    if (bytes.length >= 132 && bytes.toString('latin1', 128, 132) === 'DICM')
      return fail({
        severity: 'error',
        code: 'invalid-manifest',
        file: manifestFile,
        message: 'this is a DICOM file, not a beam-data manifest: --beam-data takes the JSON manifest of a machine (or demo)',
      });
    const text = bytes.toString('utf8');
    try {
      json = JSON.parse(text);
    } catch (e) {
      const m = /position (\d+)/.exec(String((e as Error).message));
      const pos = m ? lineColumn(text, Number(m[1])) : undefined;
      return fail({
        severity: 'error',
        code: 'invalid-manifest',
        file: manifestFile,
        ...(pos ?? {}),
        message: `not valid JSON (${(e as Error).message})`,
      });
    }
  } catch (e) {
    return fail({
      severity: 'error',
      code: 'unreadable',
      file: manifestFile,
      message: `cannot read the manifest (${(e as NodeJS.ErrnoException).code ?? String(e)})`,
    });
  }
  const parsed = Manifest.safeParse(json);
  if (!parsed.success) {
    return {
      ok: false,
      issues: parsed.error.issues.map((z) => ({
        severity: 'error',
        code: 'invalid-manifest',
        file: manifestFile,
        path: z.path
          .map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`))
          .join('')
          .replace(/^\./, ''),
        message: guidedMessage(z),
      })),
    };
  }
  const manifest = parsed.data;
  const dir = dirname(manifestFile);
  const tables: LoadedTable[] = [];
  const beams: PhotonBeamModel[] = [];
  const ids = new Set<string>();
  manifest.beams.forEach((entry, bi) => {
    if (ids.has(entry.id))
      issues.push({
        severity: 'error',
        code: 'duplicate',
        file: manifestFile,
        path: `beams[${bi}].id`,
        message: `beam id ${entry.id} is given twice`,
      });
    ids.add(entry.id);
    const beam = loadBeam(entry, dir, tables, issues);
    if (beam) beams.push(beam);
  });
  const electronBeams: ElectronBeamModel[] = [];
  manifest.electronBeams.forEach((entry, bi) => {
    if (ids.has(entry.id))
      issues.push({
        severity: 'error',
        code: 'duplicate',
        file: manifestFile,
        path: `electronBeams[${bi}].id`,
        message: `beam id ${entry.id} is given twice`,
      });
    ids.add(entry.id);
    const beam = loadElectronBeam(entry, dir, tables, issues);
    if (beam) electronBeams.push(beam);
  });
  if (issues.some((i) => i.severity === 'error')) return { ok: false, issues };
  const m = manifest.machine;
  const machine: MachineModel = {
    name: m.name,
    aliases: [m.name, ...m.aliases.filter((a) => a !== m.name)],
    sadCm: m.sadCm,
    invented: m.invented,
    ...(m.description ? { description: m.description } : {}),
    ...(m.wedgeHeel ? { wedgeHeel: m.wedgeHeel } : {}),
    ...(m.limits ? { limits: m.limits } : {}),
    version: manifest.dataVersion,
    beams,
    electronBeams,
  };
  return { ok: true, value: { machine, manifest, manifestFile, tables, manifestBytes }, warnings: issues };
}

type TableLoader = (
  quantity: string,
  spec: { file: string; interpolation: 'bilinear' | 'log-linear-rows'; clamp?: ClampAllowance | undefined },
  shape: 'grid' | 'profile',
  rowAxis: [string, keyof typeof TO_CM],
  columnAxis: [string, keyof typeof TO_CM] | undefined,
  valueScale?: number,
) => TableLookup | undefined;

/** Reads one beam's tables: each CSV parsed, its axes converted to cm, its lookup built and recorded. */
function tableLoader(beamId: string, dir: string, tables: LoadedTable[], issues: Issue[]): TableLoader {
  return (quantity, spec, shape, rowAxis, columnAxis, valueScale = 1) => {
    const file = join(dir, spec.file);
    let text: string;
    let bytes: Uint8Array;
    try {
      bytes = readFileSync(file);
      text = Buffer.from(bytes).toString('utf8');
    } catch (e) {
      issues.push({
        severity: 'error',
        code: 'missing-table',
        file,
        message: `${beamId} ${quantity}: cannot read the table (${(e as NodeJS.ErrnoException).code ?? String(e)})`,
      });
      return undefined;
    }
    const csv = parseCsvTable(text, file, shape);
    if (!csv.ok) {
      issues.push(...csv.issues);
      return undefined;
    }
    const t = csv.value;
    const rows = axis(
      rowAxis[0],
      t.rows,
      TO_CM[rowAxis[1]],
      rowAxis[1] === 'deg' ? 'deg' : 'cm',
      t.rowPositions.map((p) => ({ file, ...p })),
      issues,
    );
    const columns = columnAxis
      ? axis(
          columnAxis[0],
          t.columns!,
          TO_CM[columnAxis[1]],
          columnAxis[1] === 'deg' ? 'deg' : 'cm',
          t.columnPositions!.map((p) => ({ file, ...p })),
          issues,
        )
      : undefined;
    if (!rows || (columnAxis && !columns)) return undefined;
    const values = Float64Array.from(t.values, (v) => v * valueScale);
    // A clamp is stated in the file's units; the engine works in cm.
    const c = spec.clamp;
    const clamp: ClampAllowance | undefined = c && {
      ...(c.rowsBelow !== undefined ? { rowsBelow: c.rowsBelow * TO_CM[rowAxis[1]] } : {}),
      ...(c.rowsAbove !== undefined ? { rowsAbove: c.rowsAbove * TO_CM[rowAxis[1]] } : {}),
      ...(c.columnsBelow !== undefined && columnAxis ? { columnsBelow: c.columnsBelow * TO_CM[columnAxis[1]] } : {}),
      ...(c.columnsAbove !== undefined && columnAxis ? { columnsAbove: c.columnsAbove * TO_CM[columnAxis[1]] } : {}),
    };
    const lookup = makeTableLookup({
      name: `${beamId} ${quantity} (${spec.file})`,
      rows,
      ...(columns ? { columns } : {}),
      values,
      interpolation: spec.interpolation,
      ...(clamp ? { clamp } : {}),
    });
    tables.push({ beamId, quantity, csv: t, lookup, valueScale, bytes });
    return lookup;
  };
}

function loadBeam(entry: PhotonBeamEntry, dir: string, tables: LoadedTable[], issues: Issue[]): PhotonBeamModel | undefined {
  const load = tableLoader(entry.id, dir, tables, issues);
  const pdd =
    entry.pdd === 'derive-from-tpr'
      ? undefined
      : load(
          'pdd',
          entry.pdd,
          'grid',
          ['depth', entry.pdd.units.depth],
          ['fieldSide', entry.pdd.units.fieldSide],
          entry.pdd.units.value === 'fraction' ? 100 : 1,
        );
  const tpr =
    entry.tpr === 'derive-from-pdd'
      ? undefined
      : load(entry.tpr.kind.toLowerCase(), entry.tpr, 'grid', ['depth', entry.tpr.units.depth], ['fieldSide', entry.tpr.units.fieldSide]);
  const sc = load('sc', entry.sc, 'profile', ['fieldSide', entry.sc.units.fieldSide], undefined);
  const sp = entry.sp ? load('sp', entry.sp, 'profile', ['fieldSide', entry.sp.units.fieldSide], undefined) : undefined;
  const scp = entry.scp ? load('scp', entry.scp, 'profile', ['fieldSide', entry.scp.units.fieldSide], undefined) : undefined;
  const oar = entry.oar ? load('oar', entry.oar, 'grid', ['depth', entry.oar.units.depth], ['offAxis', entry.oar.units.offAxis]) : undefined;
  const wedges: WedgeData[] = [];
  for (const w of entry.wedges) {
    const f = w.factor;
    const lookup = f.byDepth
      ? load(`wedge ${w.id}`, f, 'grid', ['depth', f.units.depth], ['fieldSide', f.units.fieldSide])
      : load(`wedge ${w.id}`, f, 'profile', ['fieldSide', f.units.fieldSide], undefined);
    const profile = w.profile
      ? load(`wedge profile ${w.id}`, w.profile, 'grid', ['depth', w.profile.units.depth], ['towardHeel', w.profile.units.position])
      : undefined;
    if (lookup) wedges.push({ id: w.id, angleDeg: w.angleDeg, factor: lookup, byDepth: f.byDepth, ...(profile ? { profile } : {}) });
  }
  const swept = entry.sweptWedge
    ? load('swept wedge', entry.sweptWedge.factor, 'grid', ['angle', 'deg'], ['fieldSide', entry.sweptWedge.factor.units.fieldSide])
    : undefined;
  const sweptProfile = entry.sweptWedge?.profile
    ? load('swept wedge profile', entry.sweptWedge.profile, 'grid', ['angle', 'deg'], ['towardHeel', entry.sweptWedge.profile.units.position])
    : undefined;
  if (!sc || (entry.pdd !== 'derive-from-tpr' && !pdd) || (entry.tpr !== 'derive-from-pdd' && !tpr) || (!sp && !scp)) return undefined;
  return {
    id: entry.id,
    radiationType: 'PHOTON',
    nominalEnergyMV: entry.nominalEnergyMV,
    fff: entry.fff,
    calibration: { ...entry.calibration },
    ...(pdd && entry.pdd !== 'derive-from-tpr'
      ? { pdd: Object.assign(pdd, { ssdCm: entry.pdd.ssdCm, normalizationDepthCm: entry.pdd.normalizationDepthCm }) }
      : {}),
    ...(tpr && entry.tpr !== 'derive-from-pdd'
      ? { tpr: Object.assign(tpr, { normalizationDepthCm: entry.tpr.normalizationDepthCm, kind: entry.tpr.kind }) }
      : {}),
    sc,
    ...(sp ? { sp } : {}),
    ...(scp ? { scp } : {}),
    ...((entry.sp ?? entry.scp)?.measuredAtDepthCm !== undefined ? { spMeasuredAtDepthCm: (entry.sp ?? entry.scp)!.measuredAtDepthCm! } : {}),
    ...(oar && entry.oar ? { oar: Object.assign(oar, { offAxisAt: entry.oar.offAxisAt }) } : {}),
    wedges,
    ...(swept ? { sweptWedge: swept } : {}),
    ...(sweptProfile ? { sweptWedgeProfile: sweptProfile } : {}),
    trays: entry.trays,
    ...(entry.mlcTransmission !== undefined ? { mlcTransmission: entry.mlcTransmission } : {}),
    ...(entry.dosimetricLeafGapMm !== undefined ? { dosimetricLeafGapMm: entry.dosimetricLeafGapMm } : {}),
    ...(entry.collimatorExchangeK !== undefined ? { collimatorExchangeK: entry.collimatorExchangeK } : {}),
  };
}

function loadElectronBeam(entry: ElectronBeamEntry, dir: string, tables: LoadedTable[], issues: Issue[]): ElectronBeamModel | undefined {
  const load = tableLoader(entry.id, dir, tables, issues);
  const pdd = load(
    'electron pdd',
    entry.pdd,
    'grid',
    ['depth', entry.pdd.units.depth],
    ['fieldSide', entry.pdd.units.fieldSide],
    entry.pdd.units.value === 'fraction' ? 100 : 1,
  );
  const applicators: ElectronApplicatorData[] = [];
  for (const a of entry.applicators) {
    const se = load(`se ${a.id}`, a.outputFactor, 'profile', ['fieldSide', a.outputFactor.units.fieldSide], undefined);
    const ssd =
      typeof a.effectiveSsdCm === 'number'
        ? a.effectiveSsdCm
        : load(`effective ssd ${a.id}`, a.effectiveSsdCm, 'profile', ['fieldSide', a.effectiveSsdCm.units.fieldSide], undefined);
    if (se && ssd !== undefined) applicators.push({ id: a.id, sideCm: a.sideCm, outputFactor: se, effectiveSsdCm: ssd });
  }
  if (!pdd || applicators.length !== entry.applicators.length) return undefined;
  return {
    id: entry.id,
    radiationType: 'ELECTRON',
    nominalEnergyMeV: entry.nominalEnergyMeV,
    calibration: { ...entry.calibration },
    pdd: Object.assign(pdd, { ssdCm: entry.pdd.ssdCm }),
    applicators,
  };
}

/** An axis in cm, refused unless strictly increasing (interpolation depends on it). */
function axis(
  name: string,
  raw: readonly number[],
  toCm: number,
  unit: string,
  at: { file: string; line: number; column: number }[],
  issues: Issue[],
): TableAxis | undefined {
  for (let i = 1; i < raw.length; i++) {
    if (!(raw[i]! > raw[i - 1]!)) {
      issues.push({
        severity: 'error',
        code: 'invalid-table',
        ...at[i]!,
        message: `the ${name} axis is not strictly increasing`,
        expected: `a value > ${raw[i - 1]}`,
        found: `${raw[i]}`,
      });
      return undefined;
    }
  }
  return { name, unit, values: Float64Array.from(raw, (v) => v * toCm) };
}

function fail(issue: Issue): Result<never> {
  return { ok: false, issues: [issue] };
}

function lineColumn(text: string, position: number): { line: number; column: number } {
  const before = text.slice(0, position).split('\n');
  return { line: before.length, column: before[before.length - 1]!.length + 1 };
}

interface SchemaIssue {
  readonly code: string;
  readonly message: string;
  readonly keys?: readonly string[];
  readonly errors?: readonly (readonly SchemaIssue[])[];
}

/** The unknown keys of an issue, looking inside the branches of a union (an object among them is what was meant). */
function unknownKeys(z: SchemaIssue): readonly string[] {
  if (z.code === 'unrecognized_keys') return z.keys ?? [];
  if (z.code !== 'invalid_union') return [];
  for (const branch of z.errors ?? []) {
    const keys = branch.flatMap(unknownKeys);
    if (keys.length) return keys;
  }
  return [];
}

/** A schema complaint in words that guide: an unknown key with the known one it most likely meant. */
function guidedMessage(z: SchemaIssue): string {
  const keys = unknownKeys(z);
  // A null is a value `beams new` left for the physicist.
  if (!keys.length) return /received null$/.test(z.message) ? `still to fill (${z.message.replace(/^Invalid input: /, '')})` : z.message;
  return keys
    .map((k) => {
      const near = nearestKey(k);
      return `unknown key "${k}"${near ? `: did you mean "${near}"?` : ''}`;
    })
    .join('; ');
}
