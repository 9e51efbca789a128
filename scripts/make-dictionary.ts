/**
 * Generates src/dicom/dictionary.ts: keyword -> tag and VR for the attributes plumbline reads, and
 * the SOP class names used in messages, taken from pydicom's data dictionary (itself generated from
 * the DICOM standard, PS3.6). Never edit the output by hand: add the keyword below and re-run
 * `npm run dictionary`. The test suite cross-checks every entry against dcmtk's dicom.dic.
 */
import { writeFileSync, renameSync } from 'node:fs';
import { runPython } from './lib/find-python.js';

const KEYWORDS = [
  // file meta and SOP common
  'TransferSyntaxUID', 'MediaStorageSOPClassUID', 'MediaStorageSOPInstanceUID',
  'SpecificCharacterSet', 'SOPClassUID', 'SOPInstanceUID', 'Modality', 'Manufacturer',
  'StudyInstanceUID', 'SeriesInstanceUID', 'FrameOfReferenceUID', 'PatientID', 'PatientName',
  // RT General Plan
  'RTPlanLabel', 'RTPlanName', 'RTPlanDescription', 'RTPlanDate', 'RTPlanTime', 'RTPlanGeometry',
  'PlanIntent', 'ApprovalStatus', 'ReferencedStructureSetSequence', 'ReferencedDoseSequence',
  'ReferencedSOPClassUID', 'ReferencedSOPInstanceUID',
  // RT Patient Setup
  'PatientSetupSequence', 'PatientSetupNumber', 'PatientPosition', 'PatientAdditionalPosition',
  'SetupTechnique',
  // RT Prescription
  'DoseReferenceSequence', 'DoseReferenceNumber', 'DoseReferenceUID', 'DoseReferenceStructureType',
  'DoseReferenceDescription', 'ReferencedROINumber', 'DoseReferencePointCoordinates',
  'DoseReferenceType', 'TargetPrescriptionDose', 'TargetMinimumDose', 'TargetMaximumDose',
  'DeliveryWarningDose', 'DeliveryMaximumDose', 'OrganAtRiskMaximumDose',
  // RT Fraction Scheme
  'FractionGroupSequence', 'FractionGroupNumber', 'FractionGroupDescription',
  'NumberOfFractionsPlanned', 'NumberOfBeams', 'NumberOfBrachyApplicationSetups', 'BeamDoseMeaning',
  'ReferencedDoseReferenceSequence', 'ReferencedDoseReferenceNumber', 'ReferencedBeamSequence',
  'ReferencedBeamNumber', 'BeamMeterset', 'BeamDose', 'BeamDoseSpecificationPoint', 'BeamDoseType',
  'AlternateBeamDose', 'AlternateBeamDoseType', 'ReferencedDoseReferenceUID',
  'BeamDosePointDepth', 'BeamDosePointEquivalentDepth', 'BeamDosePointSSD',
  // RT Beams
  'BeamSequence', 'BeamNumber', 'BeamName', 'BeamDescription', 'BeamType', 'RadiationType',
  'TreatmentMachineName', 'ManufacturerModelName', 'DeviceSerialNumber', 'PrimaryDosimeterUnit',
  'SourceAxisDistance', 'TreatmentDeliveryType', 'ReferencedPatientSetupNumber',
  'FinalCumulativeMetersetWeight', 'NumberOfControlPoints', 'NumberOfWedges',
  'NumberOfCompensators', 'NumberOfBoli', 'NumberOfBlocks', 'TotalBlockTrayFactor',
  'BeamLimitingDeviceSequence', 'RTBeamLimitingDeviceType', 'SourceToBeamLimitingDeviceDistance',
  'NumberOfLeafJawPairs', 'LeafPositionBoundaries',
  'WedgeSequence', 'WedgeNumber', 'WedgeType', 'WedgeID', 'WedgeAngle', 'WedgeFactor',
  'WedgeOrientation', 'SourceToWedgeTrayDistance', 'EffectiveWedgeAngle',
  'CompensatorSequence', 'CompensatorNumber', 'CompensatorType', 'CompensatorID',
  'SourceToCompensatorTrayDistance', 'CompensatorRows', 'CompensatorColumns', 'MaterialID',
  'ReferencedBolusSequence',
  'BlockSequence', 'BlockNumber', 'BlockName', 'BlockTrayID', 'SourceToBlockTrayDistance',
  'BlockType', 'BlockDivergence', 'BlockMountingPosition', 'BlockThickness', 'BlockTransmission',
  'BlockNumberOfPoints', 'BlockData',
  'ApplicatorSequence', 'ApplicatorID', 'ApplicatorType', 'ApplicatorDescription',
  'DepthValueAveragingFlag', 'BeamDoseVerificationControlPointSequence',
  'ReferencedControlPointIndex', 'BeamDosePointSourceToExternalContourDistance',
  // Control points
  'ControlPointSequence', 'ControlPointIndex', 'NominalBeamEnergy', 'DoseRateSet',
  'WedgePositionSequence', 'WedgePosition', 'ReferencedWedgeNumber',
  'BeamLimitingDevicePositionSequence', 'LeafJawPositions', 'GantryAngle', 'GantryRotationDirection',
  'BeamLimitingDeviceAngle', 'BeamLimitingDeviceRotationDirection', 'PatientSupportAngle',
  'PatientSupportRotationDirection', 'TableTopEccentricAxisDistance', 'TableTopEccentricAngle',
  'TableTopEccentricRotationDirection', 'TableTopVerticalPosition', 'TableTopLongitudinalPosition',
  'TableTopLateralPosition', 'TableTopPitchAngle', 'TableTopRollAngle', 'IsocenterPosition',
  'SurfaceEntryPoint', 'SourceToSurfaceDistance', 'CumulativeMetersetWeight',
  'CumulativeDoseReferenceCoefficient',
  // CT Image
  'ImagePositionPatient', 'ImageOrientationPatient', 'PixelSpacing', 'SliceThickness', 'Rows', 'Columns',
  'BitsAllocated', 'BitsStored', 'PixelRepresentation', 'SamplesPerPixel', 'RescaleSlope', 'RescaleIntercept',
  'InstanceNumber', 'PixelData',
  // RT Dose
  'NumberOfFrames', 'GridFrameOffsetVector', 'DoseGridScaling', 'DoseUnits', 'DoseType', 'DoseSummationType',
  'ReferencedRTPlanSequence', 'ReferencedFractionGroupSequence', 'ReferencedFractionGroupNumber',
  // RT Structure Set
  'StructureSetLabel', 'StructureSetROISequence', 'ROINumber', 'ROIName', 'ReferencedFrameOfReferenceUID',
  'RTROIObservationsSequence', 'RTROIInterpretedType', 'ROIContourSequence', 'ContourSequence', 'ContourGeometricType',
  'NumberOfContourPoints', 'ContourData',
] as const;

const PY = `
import json, sys
from pydicom._dicom_dict import DicomDictionary
from pydicom._uid_dict import UID_dictionary
wanted = json.loads(sys.argv[1])
by_kw = {v[4]: (t, v) for t, v in DicomDictionary.items()}
out = {}
for kw in wanted:
    if kw not in by_kw:
        sys.exit('unknown keyword ' + kw)
    t, v = by_kw[kw]
    out[kw] = {'tag': 'x%08x' % t, 'vr': v[0], 'vm': v[1], 'retired': v[3] == 'Retired'}
sops = {u: v[0] for u, v in UID_dictionary.items() if v[1] == 'SOP Class'}
print(json.dumps({'attributes': out, 'sopClasses': sops}))
`;

const { attributes, sopClasses } = JSON.parse(runPython(PY, [JSON.stringify(KEYWORDS)])) as {
  attributes: Record<string, { tag: string; vr: string; vm: string; retired: boolean }>;
  sopClasses: Record<string, string>;
};

const lines = [
  '// Generated by scripts/make-dictionary.ts from the DICOM data dictionary (PS3.6) as shipped by',
  '// pydicom. Do not edit: add a keyword to the script and run `npm run dictionary`.',
  '',
  'export interface AttributeEntry {',
  '  /** dicom-parser element key: x + group + element, lower-case hex */',
  '  readonly tag: string;',
  '  readonly vr: string;',
  '  readonly vm: string;',
  '  readonly retired: boolean;',
  '}',
  '',
  'export const ATTRIBUTES = {',
  ...Object.entries(attributes).map(
    ([kw, a]) =>
      `  ${kw}: { tag: '${a.tag}', vr: '${a.vr}', vm: '${a.vm}', retired: ${a.retired} },`,
  ),
  '} as const satisfies Record<string, AttributeEntry>;',
  '',
  'export type Keyword = keyof typeof ATTRIBUTES;',
  '',
  '/** SOP Class UID -> name, for messages that say what a file is. */',
  'export const SOP_CLASS_NAMES: Readonly<Record<string, string>> = {',
  ...Object.entries(sopClasses)
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([uid, name]) => `  '${uid}': ${JSON.stringify(name)},`),
  '};',
  '',
];
const target = new URL('../src/dicom/dictionary.ts', import.meta.url);
const tmp = new URL('../src/dicom/dictionary.ts.tmp', import.meta.url);
writeFileSync(tmp, lines.join('\n'));
renameSync(tmp, target);
console.log(`wrote ${Object.keys(attributes).length} attributes, ${Object.keys(sopClasses).length} SOP classes`);
