import type { CalculationPoint, CheckedBeam, Clamp, Note, NoteCode, NoteValue } from '../model/index.js';
import { MM_PER_CM } from '../model/index.js';
import { planningDepthsText } from './planning-depths-text.js';
import { signed } from './table.js';

type Values = Readonly<Record<string, NoteValue>>;
const n = (v: Values, k: string): number => (typeof v[k] === 'number' ? (v[k] as number) : NaN);
const s = (v: Values, k: string, absent = '(none)'): string => (v[k] === undefined ? absent : String(v[k]));
const f1 = (v: Values, k: string) => n(v, k).toFixed(1);
const f2 = (v: Values, k: string) => n(v, k).toFixed(2);
/** "control points a–b: " for a note about one segment of a modulated beam. */
const where = (v: Values) => (v.controlPoint === undefined ? '' : `control points ${n(v, 'controlPoint')}–${n(v, 'controlPoint') + 1}: `);

/** How each heterogeneity method (or electron depth rule) is named. */
const WEDGE_MISSING: Readonly<Record<string, string>> = {
  profile: 'the beam data have no profile for it',
  heel: 'the beam data do not say where its heel points at this orientation (machine.wedgeHeel)',
};

const CT_METHOD_TEXT: Readonly<Record<string, string>> = {
  'tpr-ratio': 'the TPR ratio (effective path length)',
  batho: "Batho's power law (generalized, TMR form)",
  'electron-radiological-depth': 'the PDD at the radiological depth (equivalent thickness by relative electron density)',
};

const CUTOUT: Readonly<Record<string, (v: Values) => string>> = {
  none: (v) => `no cutout: the open applicator ${s(v, 'applicatorId')} (${n(v, 'applicatorSideCm')} cm)`,
  rectangle: (v) => `rectangular cutout ${f1(v, 'xCm')} × ${f1(v, 'yCm')} cm: Se and PDD by the square-root rule`,
  shaped: (v) => `cutout of ${n(v, 'vertices')} vertices as the square of equal area (${n(v, 'sideCm').toFixed(2)} cm)`,
};

const DEPTH_SOURCE: Readonly<Record<string, (v: Values) => string>> = {
  ct: (v) => `traced through the CT (${s(v, 'body')}) at each segment's gantry angle`,
  'plan-ssd-per-control-point': () => "below a flat surface at each control point's SSD from the plan",
  'plan-ssd': () => "below a flat surface at the plan's SSD (the gantry does not move)",
};

/** Why the CT could not give a ray's depth (geometry's `CtRefusal`), in words. */
function ctRefusalText(v: Values): string {
  switch (v.reason) {
    case 'misses-external':
      return 'the ray from the source to the point never enters the EXTERNAL contour: the point is outside the body';
    case 'hu-outside-table':
      return `HU ${n(v, 'hu')} on the ray lies outside the HU to electron density table`;
    case 'no-body-voxel':
      return 'the ray from the source to the point meets no body voxel: the point is outside the body (or outside the CT)';
    case 'point-outside-ct':
      return `the point lies outside the CT: the ray leaves the CT ${f1(v, 'gapMm')} mm before it, with no densities there`;
    case 'field-of-view-cuts-body':
      return (
        `the first CT voxel the ray meets is already at or above the body threshold (${n(v, 'bodyThresholdHu')} HU): the CT's field of view cuts ` +
        `the body (or the couch) there, so the surface and the SSD are unknown; an EXTERNAL structure would give the surface`
      );
    case 'external-outside-ct':
      return `the ray enters the EXTERNAL contour ${f1(v, 'gapMm')} mm before it enters the CT: the CT does not cover the body there`;
    default:
      return s(v, 'message', s(v, 'reason'));
  }
}

/** Every note code in words; a code without words here does not compile. */
const WORDS: Readonly<Record<NoteCode, (v: Values) => string>> = {
  'setup-beam': () => 'a setup beam, not a treatment beam',
  'radiation-type': (v) => `${s(v, 'type').toLowerCase()} beams are outside what plumbline checks`,
  'meterset-in-minutes': () => 'the meterset is in minutes, not MU',
  'no-meterset': () => 'the beam has no meterset',
  compensator: () => 'a compensator is in the beam',
  'electron-moves': () => 'an electron beam that moves or changes its field during delivery: not supported',
  'wedge-type': (v) => `a ${s(v, 'type').toLowerCase()} wedge: physical and jaw-swept (dynamic) wedges are checked, this type is not`,
  'table-eccentric': () => 'the table top eccentric angle is not 0 (not supported)',
  'no-patient-position': () => 'the patient position is not given',
  'patient-position': (v) =>
    `patient position ${s(v, 'position')}: the beam geometry supports ${s(v, 'supported').replace(/, (\w+)$/, ' and $1')} so far`,
  'no-isocenter': () => 'the first control point has no isocenter',
  'no-energy': () => 'no nominal energy',
  'input-refused': (v) => s(v, 'message'),
  'no-point': () => 'no calculation point: the plan names none and the beam has no isocenter',
  'ct-not-this-plan': () => 'the CT does not belong to this plan',
  'swept-wedge-no-angle': () => 'the dynamic wedge gives no angle',
  'swept-wedge-orientation': (v) => `the dynamic wedge gives orientation ${s(v, 'orientationDeg')}°, not along a jaw axis`,
  'wedge-off-axis': (v) =>
    `the point is ${f2(v, 'distanceCm')} cm off axis along the gradient of ${s(v, 'kind') === 'swept' ? 'swept wedge' : 'wedge'} ${s(v, 'wedge')} ` +
    `(more than ${n(v, 'limitCm')} cm), and ${WEDGE_MISSING[s(v, 'missing')] ?? s(v, 'missing')}: the central-axis wedge factor is not the point's`,
  'sad-differs': (v) => `the beam's SAD (${n(v, 'sadMm')} mm) is not the machine's (${n(v, 'machineSadCm')} cm)`,
  'no-ssd-no-ct': () => 'the plan gives no SSD, so without the CT the depth cannot be found',
  'point-above-surface': (v) => `${where(v)}the calculation point lies ${f1(v, 'heightCm')} cm above the surface`,
  'no-open-aperture': () => 'the beam has no open aperture',
  'ct-trace': (v) => (v.controlPoint === undefined ? `CT: ${ctRefusalText(v)}` : `CT, ${where(v).slice(0, -2)}: ${ctRefusalText(v)}`),
  'no-axis-ssd': () => 'the central axis meets no body voxel in the CT and the plan gives no SSD',
  'point-blocked': () => 'the calculation point lies under a block or the leaves: choose a point in the open field',
  'calculation-refused': (v) => `${where(v)}${s(v, 'message')}`,
  'heterogeneity-outside-tables': (v) =>
    `${where(v)}the heterogeneity correction needs TPR at ${n(v, 'radiologicalDepthCm').toFixed(2)} cm, outside the tables`,
  'modulated-blocks': () => 'a modulated beam with blocks: not supported',
  'modulated-wedge': () => 'a modulated beam with a wedge in: not supported',
  'collimator-or-couch-turns': () => 'the collimator or the couch turns during the beam: not supported',
  'energy-changes': () => 'the energy changes during the beam',
  'no-meterset-delivered': () => 'no control point delivers any meterset',
  'aperture-closed': () => 'every leaf pair is closed at every control point: the beam delivers only transmission, there is no field to check',
  'segment-no-ssd': (v) => `${where(v)}the plan gives no SSD there and no CT was given, so the depth at that gantry angle cannot be found`,
  'segment-no-aperture': (v) => `${where(v)}no aperture (no jaws and no leaves along an axis)`,
  'electron-no-applicator': () => 'an electron beam without an applicator in the plan',
  'electron-blocks': () => 'an electron beam with shielding blocks or more than one cutout: not supported',
  'cutout-too-large': (v) =>
    `the cutout (${f1(v, 'spanCm')} cm across) is larger than the applicator ${s(v, 'applicatorId')} (${n(v, 'applicatorSideCm')} cm)`,
  'homogeneous-refused': (v) => `the homogeneous comparison: ${s(v, 'message')}`,
  'ssd-irregular-tpr-form': () =>
    'SSD setup of an irregular field: calculated in the TPR form at the point (SPD = SSD + d), which equals the PDD form for consistent beam data',
  'clarkson-irregular': (v) => {
    const blocks = n(v, 'blocks');
    const what = [n(v, 'mlc') ? 'MLC' : '', blocks ? `${blocks} block(s)` : ''].filter(Boolean).join(' and ');
    const bt = Array.isArray(v.blockTransmissions) ? v.blockTransmissions.join(', ') : '';
    return (
      `irregular field (${what}) by Clarkson integration over ${n(v, 'sectors')} sectors; leaf transmission ` +
      `${n(v, 'leafTransmission')}${blocks ? `, block transmission as the plan states (${bt})` : ''}`
    );
  },
  'wedge-profile-not-applied': (v) =>
    `the wedge profile is not applied: orientation ${s(v, 'orientationDeg')}° is not 0, 90, 180 or 270, or the beam data do not say where the heel points`,
  'wedge-central-axis-factor': (v) =>
    `the wedge factor is the central-axis value${v.distanceCm !== undefined ? ` ${f2(v, 'distanceCm')} cm along the gradient` : ''}; ` +
    'no wedge profile is applied',
  'swept-wedge-asymmetric': () => 'the swept-wedge factor is for a field centred on the axis; this one is asymmetric along the sweep',
  'bolus-depth': () => "a bolus is referenced: the depth is taken from the plan's SSD, which must include it",
  'table-pitch-roll-ignored': () => 'table top pitch and roll are ignored',
  'batho-interface-in-build-up': (v) => `an interface ${f1(v, 'distanceCm')} cm upstream of the point, within dmax: Batho's law is not defined there`,
  'batho-point-medium': (v) =>
    `the point lies in a medium of relative electron density ${n(v, 'density')}: the ratio of its mass energy-absorption coefficient to water's is not ` +
    'applied (taken as 1)',
  'modulated-clarkson': (v) =>
    `modulated beam by modified Clarkson integration (Kung, Chen and Kuchnir 2000): ${n(v, 'segments')} segments between ${n(v, 'controlPoints')} ` +
    `control points, ` +
    `each with its own aperture, gantry angle and depth, weighted by its MU share; ${n(v, 'sectors')} sectors, leaf transmission ${n(v, 'leafTransmission')}`,
  'modulated-depths': (v) => `depths ${(DEPTH_SOURCE[s(v, 'source')] ?? (() => s(v, 'source')))(v)}`,
  'modulated-heterogeneity': (v) =>
    `heterogeneity corrected per segment by ${CT_METHOD_TEXT[s(v, 'method')] ?? s(v, 'method')}: dose-weighted CF ${n(v, 'correctionFactor').toFixed(4)} ` +
    `(homogeneous dose ${f1(v, 'homogeneousDoseCGy')} cGy)`,
  'leaf-ends-not-modelled': () =>
    'the rounded leaf ends are not modelled (the beam data give no dosimetric leaf gap), nor the tongue-and-groove effect',
  'leaf-end-gap': (v) =>
    `each open leaf pair widened by the dosimetric leaf gap of ${n(v, 'gapMm')} mm (the rounded leaf ends); the tongue-and-groove effect is not modelled`,
  'electron-cutout': (v) =>
    `${(CUTOUT[s(v, 'cutout')] ?? (() => s(v, 'cutout')))(v)}${v.effectiveSsdCm === undefined ? '' : `; effective SSD ${f1(v, 'effectiveSsdCm')} cm`}`,
  'electron-extended-ssd': (v) =>
    `extended SSD: the PDD measured at ${n(v, 'measuredSsdCm')} cm is used at ${f1(v, 'ssdCm')} cm, with the inverse square of the effective SSD for ` +
    `the air gap`,
  'electron-off-axis': (v) =>
    `the point is ${f1(v, 'offAxisCm')} cm from the central axis: electron doses are central-axis values (no off-axis ratio)`,
  'outside-field': (v) => `the point lies outside the field (${f1(v, 'beyondCm')} cm beyond its edge)`,
  'near-field-edge': (v) => `the point is ${f1(v, 'edgeDistanceCm')} cm from the field edge (margin ${n(v, 'marginCm')} cm)`,
  'build-up': (v) => `the point is in the build-up region (${f1(v, 'depthCm')} cm, shallower than dmax ${n(v, 'dmaxCm')} cm)`,
  'past-interface': (v) =>
    `the point is ${(n(v, 'distanceMm') / MM_PER_CM).toFixed(1)} cm past a density interface along the ray (margin ${n(v, 'marginCm')} cm)`,
  'covered-by-leaves': (v) =>
    `the point is under the leaves or outside the jaws for ${n(v, 'percent').toFixed(0)} % of the MU: its dose rests on leaf transmission and penumbra`,
  'build-up-some-angles': (v) =>
    `the point is in the build-up region at some gantry angles (depth down to ${f1(v, 'minDepthCm')} cm, dmax ${n(v, 'dmaxCm')} cm)`,
  'ssd-differs-some-angle': (v) =>
    `the SSD from the CT differs from the plan's by up to ${f1(v, 'maxDifferenceMm')} mm at some control point (tolerance ${n(v, 'toleranceMm')} mm): ` +
    'bolus missing, wrong CT or wrong isocenter?',
  'electron-build-up': (v) =>
    `the point is in the build-up region (${f1(v, 'depthCm')} cm, shallower than this field's dmax ${f1(v, 'dmaxCm')} cm, ` +
    `PDD ${f1(v, 'pddPercent')} % < ${n(v, 'thresholdPercent')} %)`,
  'steep-fall-off': (v) =>
    `the point lies on the steep fall-off of the depth dose (PDD ${n(v, 'pddPercent').toFixed(0)} % < ${n(v, 'thresholdPercent')} %)`,
  'no-beam-dose': () => 'the plan gives no Beam Dose for this beam, so there is nothing to compare with',
  'judged-on-composite': (v) =>
    `a modulated beam is judged on the composite of the ${n(v, 'beams')} modulated beams at its point ` +
    `(${signed(n(v, 'deviationPercent'), 2)} %); its own deviation is for information`,
  'judged-on-share': (v) => `the beam gives ${f1(v, 'sharePercent')} % of the point's dose, so it is judged on its share of the point dose`,
  'no-dose-at-point': () =>
    'no dose of the planning system is known at --point (its Beam Dose applies elsewhere; no per-beam RT Dose given): our dose is shown, not judged',
  'compared-with-dose-grid': () => "compared with the planning system's per-beam RT Dose grid at --point (its Beam Dose applies elsewhere)",
  'dose-point-unstated': () => 'the plan does not say where its Beam Dose applies',
  'point-unfit': () => 'the point is not fit for a point check',
  'ct-correction': (v) =>
    `CT depths: heterogeneity corrected by ${CT_METHOD_TEXT[s(v, 'method')] ?? s(v, 'method')}, CF = ${n(v, 'correctionFactor').toFixed(4)} ` +
    `(homogeneous dose ${f1(v, 'homogeneousDoseCGy')} cGy)`,
  'ct-ssd-differs': (v) =>
    `the SSD from the CT (${(n(v, 'ctSsdMm') / MM_PER_CM).toFixed(1)} cm) differs from the plan's (${(n(v, 'planSsdMm') / MM_PER_CM).toFixed(1)} cm) ` +
    `by ${f1(v, 'differenceMm')} mm (tolerance ${n(v, 'toleranceMm')} mm): bolus missing, wrong CT or wrong isocenter?`,
  'planning-system-depths': () => "the planning system's own depth data",
  'ssd-equals-sad': (v) => `the SSD (${f1(v, 'ssdCm')} cm) equals the SAD: the isocenter is on the surface`,
  'isocenter-deep': (v) => `the isocenter lies ${f1(v, 'depthCm')} cm deep`,
  'modulated-tpr-form': () => 'a modulated beam: every segment in the TPR form at the point',
  'electron-applicator': (v) =>
    `an electron beam with applicator ${s(v, 'applicatorId')} at SSD ${f1(v, 'ssdCm')} cm (nominal ${n(v, 'nominalSsdCm')} cm)`,
  'beams-not-checked': (v) => `${n(v, 'count')} beam(s) not checked: the plan is not fully verified`,
  'no-beam-checked': () => 'no beam of this plan could be checked',
  'planning-system-heterogeneity-corrected': (v) =>
    `the planning system says its dose is heterogeneity corrected (${s(v, 'correction')}); without the CT the ` +
    'independent doses are homogeneous, so the beams are judged with the heterogeneous levels',
  'heterogeneity-unknown': () =>
    "whether the planning system's dose is heterogeneity corrected is not known (no CT given, no RT Dose says): " +
    'the category assumes a water-like patient',
  'approval-status': (v) => `the plan's approval status is ${s(v, 'status', 'not given')}`,
  'mu-beyond-machine': (v) => `${f1(v, 'mu')} MU is more than machine ${s(v, 'machine')} delivers in one beam (${n(v, 'maxMu')} MU, its beam data)`,
  'dose-not-this-plan': (v) =>
    `none of the RT Dose given (${s(v, 'files')}) references this plan or its frame of reference: no dose grid was compared`,
  'no-ct-in-frame': () => "no CT series in this plan's frame of reference among --ct: checked without CT",
  'ct-without-density': () => 'a CT arrived but the service has no density table (ct.density): checked without CT',
  'ct-unusable': (v) => `the CT could not be used (${s(v, 'message')}): checked without CT`,
  'dose-unreadable': (v) => `an RT Dose could not be read (${s(v, 'message')})`,
};

/** A note in words. */
export function noteText(note: Note): string {
  return WORDS[note.code](note.values);
}

/** A checked beam's verdict reasons in words, its point-fitness flags and the planning system's depths written out, then its approximations. */
export function reasonTexts(b: CheckedBeam): string[] {
  const out = b.verdictReasons.map((r) => {
    if (r.code === 'point-unfit') return `${noteText(r)}: ${b.fitness.flags.map(noteText).join('; ')}`;
    if (r.code === 'planning-system-depths' && b.calculation.planningSystemDepths)
      return planningDepthsText(b.calculation.planningSystemDepths, "the planning system's own depth data:");
    return noteText(r);
  });
  return [...out, ...b.calculation.approximations.map(noteText)];
}

/** Why this point: which attribute or option named it. */
export function pointText(p: Pick<CalculationPoint, 'source' | 'doseReferenceVia' | 'doseReferenceNumber'>): string {
  switch (p.source) {
    case 'user':
      return '--point given';
    case 'beam-dose-specification-point':
      return 'the Beam Dose Specification Point of the beam in the fraction group';
    case 'dose-reference':
      return p.doseReferenceVia === 'referenced-uid'
        ? `dose reference ${p.doseReferenceNumber} named by the beam's Referenced Dose Reference UID`
        : `dose reference ${p.doseReferenceNumber}, the fraction group's only dose reference with coordinates`;
    case 'prescription-point':
      return `dose reference ${p.doseReferenceNumber}, the plan's only target point`;
    case 'isocenter':
      return 'the plan names no point for its Beam Dose; the isocenter is used and the comparison assumes the Beam Dose applies there';
    case 'suggested':
      return 'a point suggested by plumbline';
  }
}

/** A clamped lookup in words. */
export function clampText(c: Clamp): string {
  return `${c.table}: ${c.axis} ${c.requested.toFixed(2)} ${c.unit} clamped to ${c.used} ${c.unit}`;
}
