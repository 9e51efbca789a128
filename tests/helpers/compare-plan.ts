/**
 * Compares the importer's `Plan` with a reference tool's reading of the same file, attribute by
 * attribute. The spec below says, for every attribute the importer extracts, where it lives in the
 * model. Control points get the carry-forward rule: an attribute absent at control point k must be
 * in force with the value it had at k - 1 (except the SSD and surface entry point, never carried).
 */
import { isDeepStrictEqual } from 'node:util';
import type { Plan } from '../../src/model/index.js';
import type { RefNode, RefValue } from './reference-tree.js';

type Getter = (m: any) => unknown;
interface SeqSpec {
  readonly items: (m: any) => readonly unknown[];
  readonly fields: Spec;
  /** Find the model item for a reference item (default: same position). */
  readonly match?: (ref: RefNode, items: readonly any[]) => unknown;
  /** Apply the carry-forward rule to this sequence's items. */
  readonly carry?: boolean;
  /** Extra carry-forward check for nested sequences of a carried item. */
  readonly carryCheck?: (ref: RefNode, model: any, prev: any) => string | undefined;
}
type Spec = Readonly<Record<string, Getter | SeqSpec>>;

const str = (ref: RefNode, kw: string): string | undefined => {
  const v = ref.get(kw);
  return v && 'values' in v ? v.values[0] : undefined;
};
const yesNo = (b: boolean | undefined) => (b === undefined ? undefined : b ? 'YES' : 'NO');

const CONTROL_POINT: Spec = {
  ControlPointIndex: (c) => c.index,
  NominalBeamEnergy: (c) => c.nominalEnergyMeV,
  DoseRateSet: (c) => c.doseRateSet,
  GantryAngle: (c) => c.gantryAngleDeg,
  GantryRotationDirection: (c) => c.gantryRotation,
  BeamLimitingDeviceAngle: (c) => c.collimatorAngleDeg,
  BeamLimitingDeviceRotationDirection: (c) => c.collimatorRotation,
  PatientSupportAngle: (c) => c.couchAngleDeg,
  PatientSupportRotationDirection: (c) => c.couchRotation,
  TableTopEccentricAxisDistance: (c) => c.tableTopEccentricAxisDistanceMm,
  TableTopEccentricAngle: (c) => c.tableTopEccentricAngleDeg,
  TableTopEccentricRotationDirection: (c) => c.tableTopEccentricRotation,
  TableTopVerticalPosition: (c) => c.tableTopVerticalMm,
  TableTopLongitudinalPosition: (c) => c.tableTopLongitudinalMm,
  TableTopLateralPosition: (c) => c.tableTopLateralMm,
  TableTopPitchAngle: (c) => c.tableTopPitchDeg,
  TableTopRollAngle: (c) => c.tableTopRollDeg,
  IsocenterPosition: (c) => c.isocenterPatientMm,
  SurfaceEntryPoint: (c) => c.surfaceEntryPointPatientMm,
  SourceToSurfaceDistance: (c) => c.ssdMm,
  CumulativeMetersetWeight: (c) => c.cumulativeMetersetWeight,
  BeamLimitingDevicePositionSequence: {
    items: (c) => c.devices,
    match: (ref, items) => items.find((d) => d.type === str(ref, 'RTBeamLimitingDeviceType')),
    fields: { RTBeamLimitingDeviceType: (d) => d.type, LeafJawPositions: (d) => d.positionsMm },
  },
  WedgePositionSequence: {
    items: (c) => c.wedgePositions,
    match: (ref, items) => items.find((w) => String(w.wedgeNumber) === str(ref, 'ReferencedWedgeNumber')),
    fields: { ReferencedWedgeNumber: (w) => w.wedgeNumber, WedgePosition: (w) => w.position },
  },
  ReferencedDoseReferenceSequence: {
    items: (c) => c.doseReferenceCoefficients,
    fields: { ReferencedDoseReferenceNumber: (r) => r.doseReferenceNumber, CumulativeDoseReferenceCoefficient: (r) => r.cumulativeCoefficient },
  },
};

const BEAM: Spec = {
  BeamNumber: (b) => b.number,
  BeamName: (b) => b.name,
  BeamDescription: (b) => b.description,
  BeamType: (b) => b.beamType,
  RadiationType: (b) => b.radiationType,
  TreatmentMachineName: (b) => b.machineName,
  Manufacturer: (b) => b.manufacturer,
  ManufacturerModelName: (b) => b.manufacturerModelName,
  DeviceSerialNumber: (b) => b.deviceSerialNumber,
  PrimaryDosimeterUnit: (b) => b.primaryDosimeterUnit,
  SourceAxisDistance: (b) => b.sourceAxisDistanceMm,
  TreatmentDeliveryType: (b) => b.treatmentDeliveryType,
  ReferencedPatientSetupNumber: (b) => b.patientSetupNumber,
  FinalCumulativeMetersetWeight: (b) => b.finalCumulativeMetersetWeight,
  NumberOfControlPoints: (b) => b.controlPoints.length,
  NumberOfWedges: (b) => b.wedges.length,
  NumberOfBlocks: (b) => b.blocks.length,
  NumberOfCompensators: (b) => b.compensators.length,
  NumberOfBoli: (b) => b.bolusRoiNumbers.length,
  TotalBlockTrayFactor: (b) => b.totalBlockTrayFactor,
  BeamLimitingDeviceSequence: {
    items: (b) => b.limitingDevices,
    fields: {
      RTBeamLimitingDeviceType: (d) => d.type,
      NumberOfLeafJawPairs: (d) => d.numberOfPairs,
      LeafPositionBoundaries: (d) => d.leafBoundariesMm,
      SourceToBeamLimitingDeviceDistance: (d) => d.sourceToDeviceDistanceMm,
    },
  },
  WedgeSequence: {
    items: (b) => b.wedges,
    fields: {
      WedgeNumber: (w) => w.number,
      WedgeType: (w) => w.type,
      WedgeID: (w) => w.id,
      WedgeAngle: (w) => w.angleDeg,
      WedgeFactor: (w) => w.factor,
      WedgeOrientation: (w) => w.orientationDeg,
      SourceToWedgeTrayDistance: (w) => w.sourceToWedgeTrayDistanceMm,
      EffectiveWedgeAngle: (w) => w.effectiveAngleDeg,
    },
  },
  BlockSequence: {
    items: (b) => b.blocks,
    fields: {
      BlockNumber: (k) => k.number,
      BlockName: (k) => k.name,
      BlockTrayID: (k) => k.trayId,
      SourceToBlockTrayDistance: (k) => k.sourceToTrayDistanceMm,
      BlockType: (k) => k.type,
      BlockDivergence: (k) => k.divergence,
      BlockMountingPosition: (k) => k.mountingPosition,
      MaterialID: (k) => k.materialId,
      BlockThickness: (k) => k.thicknessMm,
      BlockTransmission: (k) => k.transmission,
      BlockNumberOfPoints: (k) => k.outlineMm.length,
      BlockData: (k) => k.outlineMm.flat(),
    },
  },
  ApplicatorSequence: {
    items: (b) => b.applicators,
    fields: { ApplicatorID: (a) => a.id, ApplicatorType: (a) => a.type, ApplicatorDescription: (a) => a.description },
  },
  ReferencedBolusSequence: { items: (b) => b.bolusRoiNumbers.map((n: number) => ({ n })), fields: { ReferencedROINumber: (x) => x.n } },
  CompensatorSequence: {
    items: (b) => b.compensators,
    fields: {
      CompensatorNumber: (c) => c.number,
      CompensatorType: (c) => c.type,
      CompensatorID: (c) => c.id,
      MaterialID: (c) => c.materialId,
      CompensatorRows: (c) => c.rows,
      CompensatorColumns: (c) => c.columns,
      SourceToCompensatorTrayDistance: (c) => c.sourceToTrayDistanceMm,
    },
  },
  ReferencedDoseReferenceSequence: {
    items: (b) => b.doseVerification,
    fields: {
      ReferencedDoseReferenceNumber: (v) => v.doseReferenceNumber,
      DepthValueAveragingFlag: (v) => yesNo(v.depthValueAveraging),
      BeamDoseVerificationControlPointSequence: {
        items: (v) => v.points,
        fields: {
          CumulativeMetersetWeight: (p) => p.cumulativeMetersetWeight,
          ReferencedControlPointIndex: (p) => p.controlPointIndex,
          BeamDosePointDepth: (p) => p.pointDepthMm,
          BeamDosePointEquivalentDepth: (p) => p.equivalentDepthMm,
          BeamDosePointSSD: (p) => p.ssdMm,
          BeamDosePointSourceToExternalContourDistance: (p) => p.sourceToExternalContourMm,
        },
      },
    },
  },
  ControlPointSequence: {
    items: (b) => b.controlPoints,
    carry: true,
    fields: CONTROL_POINT,
    carryCheck: (ref, cp, prev) => {
      const given = (ref.get('BeamLimitingDevicePositionSequence') as { items?: RefNode[] } | undefined)?.items ?? [];
      for (const d of cp.devices) {
        if (given.some((g) => str(g, 'RTBeamLimitingDeviceType') === d.type)) continue;
        const before = prev.devices.find((p: any) => p.type === d.type);
        if (!isDeepStrictEqual(before?.positionsMm, d.positionsMm)) return `${d.type} positions not carried forward`;
      }
      return undefined;
    },
  },
};

export const PLAN_SPEC: Spec = {
  SOPClassUID: (p) => p.sopClassUid,
  SOPInstanceUID: (p) => p.sopInstanceUid,
  StudyInstanceUID: (p) => p.studyInstanceUid,
  SeriesInstanceUID: (p) => p.seriesInstanceUid,
  FrameOfReferenceUID: (p) => p.frameOfReferenceUid,
  PatientID: (p) => p.patient.id,
  PatientName: (p) => p.patient.name,
  RTPlanLabel: (p) => p.label,
  RTPlanName: (p) => p.name,
  RTPlanDescription: (p) => p.description,
  RTPlanDate: (p) => p.date,
  RTPlanTime: (p) => p.time,
  RTPlanGeometry: (p) => p.geometry,
  PlanIntent: (p) => p.intent,
  ApprovalStatus: (p) => p.approvalStatus,
  ReferencedStructureSetSequence: {
    items: (p) => p.referencedStructureSetUids.map((u: string) => ({ u })),
    fields: { ReferencedSOPInstanceUID: (x) => x.u },
  },
  ReferencedDoseSequence: { items: (p) => p.referencedDoseUids.map((u: string) => ({ u })), fields: { ReferencedSOPInstanceUID: (x) => x.u } },
  PatientSetupSequence: {
    items: (p) => p.patientSetups,
    fields: {
      PatientSetupNumber: (s) => s.number,
      PatientPosition: (s) => s.position,
      PatientAdditionalPosition: (s) => s.additionalPosition,
      SetupTechnique: (s) => s.setupTechnique,
    },
  },
  DoseReferenceSequence: {
    items: (p) => p.doseReferences,
    fields: {
      DoseReferenceNumber: (d) => d.number,
      DoseReferenceUID: (d) => d.uid,
      DoseReferenceStructureType: (d) => d.structureType,
      DoseReferenceDescription: (d) => d.description,
      ReferencedROINumber: (d) => d.roiNumber,
      DoseReferencePointCoordinates: (d) => d.pointPatientMm,
      DoseReferenceType: (d) => d.type,
      TargetPrescriptionDose: (d) => d.targetPrescriptionDoseGy,
      TargetMinimumDose: (d) => d.targetMinimumDoseGy,
      TargetMaximumDose: (d) => d.targetMaximumDoseGy,
      DeliveryWarningDose: (d) => d.deliveryWarningDoseGy,
      DeliveryMaximumDose: (d) => d.deliveryMaximumDoseGy,
      OrganAtRiskMaximumDose: (d) => d.organAtRiskMaximumDoseGy,
    },
  },
  FractionGroupSequence: {
    items: (p) => p.fractionGroups,
    fields: {
      FractionGroupNumber: (g) => g.number,
      FractionGroupDescription: (g) => g.description,
      NumberOfFractionsPlanned: (g) => g.fractionsPlanned,
      BeamDoseMeaning: (g) => g.beamDoseMeaning,
      NumberOfBeams: (g) => g.beams.length,
      ReferencedDoseReferenceSequence: {
        items: (g) => g.doseReferences,
        fields: { ReferencedDoseReferenceNumber: (r) => r.doseReferenceNumber, TargetPrescriptionDose: (r) => r.targetPrescriptionDoseGy },
      },
      ReferencedBeamSequence: {
        items: (g) => g.beams,
        fields: {
          ReferencedBeamNumber: (b) => b.beamNumber,
          BeamMeterset: (b) => b.beamMeterset,
          BeamDose: (b) => b.beamDoseGy,
          BeamDoseSpecificationPoint: (b) => b.beamDoseSpecificationPointPatientMm,
          BeamDoseType: (b) => b.beamDoseType,
          AlternateBeamDose: (b) => b.alternateBeamDoseGy,
          AlternateBeamDoseType: (b) => b.alternateBeamDoseType,
          ReferencedDoseReferenceUID: (b) => b.doseReferenceUid,
          BeamDosePointDepth: (b) => b.pointDepthMm,
          BeamDosePointEquivalentDepth: (b) => b.equivalentDepthMm,
          BeamDosePointSSD: (b) => b.pointSsdMm,
        },
      },
    },
  },
  BeamSequence: { items: (p) => p.beams, fields: BEAM },
};

const NUMERIC = new Set(['DS', 'IS', 'FL', 'FD', 'US', 'UL', 'SS', 'SL']);

export interface Comparison {
  readonly checked: number;
  readonly mismatches: readonly string[];
}

/** Compares every attribute of the spec; returns how many values were checked and every mismatch. */
export function comparePlanWithReference(plan: Plan, ref: RefNode): Comparison {
  const mismatches: string[] = [];
  let checked = 0;

  const expectedOf = (v: RefValue): unknown => {
    if (!('values' in v) || v.values.length === 0) return undefined;
    return NUMERIC.has(v.vr) ? v.values.map(Number) : v.values.map((s) => s.trim());
  };
  const same = (vr: string, want: readonly unknown[], got: unknown): boolean => {
    const arr = Array.isArray(got) ? got : [got];
    if (arr.length !== want.length) return false;
    return want.every((w, i) => {
      const g = arr[i];
      if (typeof w === 'number') {
        if (typeof g !== 'number') return false;
        // FL is single precision: dcmdump and pydicom print it rounded.
        const tol = vr === 'FL' ? 1e-6 * Math.max(1, Math.abs(w)) : 0;
        return Math.abs(w - g) <= tol;
      }
      return String(g) === w;
    });
  };

  // Geometric results of a control point's own gantry angle are never carried forward.
  const NOT_CARRIED = new Set(['SourceToSurfaceDistance', 'SurfaceEntryPoint']);
  const walk = (node: RefNode, model: unknown, spec: Spec, path: string, prev?: unknown, carry = false) => {
    for (const [kw, s] of Object.entries(spec)) {
      const r = node.get(kw);
      const at = `${path}.${kw}`;
      if (typeof s === 'function') {
        const got = s(model);
        const want = r ? expectedOf(r) : undefined;
        checked++;
        if (want === undefined) {
          if (carry && prev !== undefined && !NOT_CARRIED.has(kw)) {
            if (!isDeepStrictEqual(got, s(prev)))
              mismatches.push(
                `${at}: absent here, so the value in force should be carried forward (${JSON.stringify(s(prev))}), model has ${JSON.stringify(got)}`,
              );
          } else if (got !== undefined && !(Array.isArray(got) && got.length === 0)) {
            mismatches.push(`${at}: reference has no value, model has ${JSON.stringify(got)}`);
          }
        } else if (!same((r as { vr: string }).vr, want as unknown[], got)) {
          mismatches.push(`${at}: reference ${JSON.stringify(want)}, model ${JSON.stringify(got)}`);
        }
        continue;
      }
      const refItems = r && 'items' in r ? r.items : [];
      const modelItems = s.items(model) ?? [];
      if (!s.match && refItems.length !== modelItems.length) {
        mismatches.push(`${at}: reference has ${refItems.length} items, model ${modelItems.length}`);
        continue;
      }
      refItems.forEach((ri, i) => {
        const mi = s.match ? s.match(ri, modelItems) : modelItems[i];
        if (mi === undefined) {
          mismatches.push(`${at}[${i}]: no matching model item`);
          return;
        }
        const prevItem = s.carry && i > 0 ? modelItems[i - 1] : undefined;
        walk(ri, mi, s.fields, `${at}[${i}]`, prevItem, !!s.carry && i > 0);
        if (s.carryCheck && prevItem !== undefined) {
          checked++;
          const problem = s.carryCheck(ri, mi, prevItem);
          if (problem) mismatches.push(`${at}[${i}]: ${problem}`);
        }
      });
    }
  };
  walk(ref, plan, PLAN_SPEC, '');
  return { checked, mismatches };
}
