import { z } from 'zod';
import { Note } from './check-note.js';
import { IssueJson } from './issue-json.js';

/** Our three verdicts; wording is ours, text first (colour only ever as emphasis). */
export const Verdict = z.enum(['within tolerance', 'needs review', 'beyond action level']);
export type Verdict = z.infer<typeof Verdict>;

/**
 * A plan's headline, in order of severity: a beam's verdicts, and "not verified" when a beam that
 * delivers dose could not be checked (or none was): such a plan is never called within tolerance.
 */
export const PlanVerdict = z.enum(['within tolerance', 'needs review', 'not verified', 'beyond action level']);
export type PlanVerdict = z.infer<typeof PlanVerdict>;

export const CaseCategory = z.enum(['on-axis-open', 'off-axis-or-wedged', 'irregular-or-small', 'large-ssd', 'heterogeneous', 'modulated']);
export type CaseCategory = z.infer<typeof CaseCategory>;

export const PointSource = z.enum(['user', 'beam-dose-specification-point', 'dose-reference', 'prescription-point', 'isocenter', 'suggested']);

export const CalculationPoint = z.object({
  /** Which attribute or option named this point. */
  source: PointSource,
  /** For a dose reference: named by the beam's Referenced Dose Reference UID, or the fraction group's only one with coordinates. */
  doseReferenceVia: z.enum(['referenced-uid', 'only-in-fraction-group']).optional(),
  patientMm: z.tuple([z.number(), z.number(), z.number()]),
  /** Whether the planning system's Beam Dose is stated at this point (else the comparison is an assumption). */
  planningSystemDoseHere: z.boolean(),
  /** The dose reference whose point this is, when it is one. */
  doseReferenceNumber: z.number().int().optional(),
});
export type CalculationPoint = z.infer<typeof CalculationPoint>;

export const FactorJson = z.object({ key: z.string(), label: z.string(), value: z.number(), args: z.array(z.number()), name: z.string().optional() });

/** A lookup clamped to a table's edge, as the beam data allow: requested and used, in the axis's unit. */
export const Clamp = z.object({ table: z.string(), axis: z.string(), requested: z.number(), used: z.number(), unit: z.string() });
export type Clamp = z.infer<typeof Clamp>;

/** How the dose was corrected for heterogeneity (photons) or looked up (electrons) with the CT. */
export const CtMethod = z.enum(['tpr-ratio', 'batho', 'electron-radiological-depth']);

/** Where a modulated beam's depths came from. */
export const DepthSource = z.enum(['ct', 'plan-ssd-per-control-point', 'plan-ssd']);

export const PointFitness = z.object({
  /** Distance from the point to the nearest field edge at its depth, cm (negative: outside the field). */
  edgeDistanceCm: z.number(),
  flags: z.array(Note),
  suggestion: z
    .object({ patientMm: z.tuple([z.number(), z.number(), z.number()]), depthCm: z.number(), offAxisCm: z.number(), edgeDistanceCm: z.number() })
    .optional(),
});

/** What the plan says of a beam, checked or not. */
const BeamIdentity = {
  beamNumber: z.number(),
  beamName: z.string().optional(),
  radiationType: z.string(),
  nominalEnergy: z.number().optional(),
  plannedMu: z.number().optional(),
  /** The planning system's dose for the beam at the point: its Beam Dose, or at a point of the user's its RT Dose grid there. */
  planningSystemDoseCGy: z.number().optional(),
  /** Where that dose came from; absent for the Beam Dose (as before this field). */
  planningSystemDoseFrom: z.enum(['beam dose', 'dose grid']).optional(),
  /** A per-beam RT Dose grid at the point (summation BEAM), beside the Beam Dose and our dose. */
  doseGridCGy: z.number().optional(),
};

export const Calculation = z.object({
  machineBeam: z.string(),
  setup: z.enum(['SSD', 'SAD']),
  /** Why this setup: the SSD against the SAD, or the kind of beam. */
  setupBasis: Note,
  ssdCm: z.number(),
  depthCm: z.number(),
  offAxisCm: z.number(),
  collimatorFieldCm: z.object({ x: z.number(), y: z.number() }),
  collimatorSquareCm: z.number(),
  irradiatedSquareCm: z.number(),
  wedgeId: z.string().optional(),
  approximations: z.array(Note),
  factors: z.array(FactorJson),
  dosePerMuCGy: z.number(),
  independentDoseCGy: z.number(),
  independentMu: z.number().optional(),
  doseDeviationPercent: z.number().optional(),
  muDeviationPercent: z.number().optional(),
  clamps: z.array(Clamp),
  /** With the patient's CT: the traced geometry and the heterogeneity correction. */
  ct: z
    .object({
      ssdAlongAxisMm: z.number().optional(),
      planSsdMm: z.number().optional(),
      ssdDifferenceMm: z.number().optional(),
      ssdAlongRayMm: z.number(),
      /** Projected on the central axis direction (the formalism's depth), see `alongRay`. */
      geometricDepthMm: z.number(),
      radiologicalDepthMm: z.number(),
      /** The ray's angle to the central axis (its cosine) and the depths along the ray, before the projection. */
      alongRay: z.object({ cosine: z.number(), geometricDepthMm: z.number(), radiologicalDepthMm: z.number() }).optional(),
      entryPatientMm: z.tuple([z.number(), z.number(), z.number()]),
      densityRange: z.tuple([z.number(), z.number()]),
      nearestInterfaceMm: z.number().optional(),
      correctionFactor: z.number(),
      homogeneousDoseCGy: z.number(),
      bodyThresholdHu: z.number(),
      /** How the surface was found: the EXTERNAL structure or the HU threshold. */
      body: z.string(),
      method: CtMethod,
    })
    .optional(),
  /** An electron beam: applicator, cutout and the effective SSD for its air gap. */
  electron: z
    .object({
      applicatorId: z.string(),
      cutout: z.enum(['none', 'rectangle', 'shaped']),
      fieldSideCm: z.number(),
      effectiveSsdCm: z.number(),
      airGapCm: z.number(),
      pddPercent: z.number(),
    })
    .optional(),
  /** A modulated beam: how its segments were summed, and over what range of geometry. */
  modulated: z
    .object({
      method: z.string(),
      controlPoints: z.number(),
      segments: z.number(),
      gantryStartDeg: z.number(),
      gantryEndDeg: z.number(),
      depthSource: DepthSource,
      depthRangeCm: z.tuple([z.number(), z.number()]),
      radiologicalDepthRangeCm: z.tuple([z.number(), z.number()]).optional(),
      correctionFactor: z.number().optional(),
      homogeneousDoseCGy: z.number().optional(),
      /** The largest difference between the CT's SSD and the plan's over the control points that state one. */
      maxSsdDifferenceMm: z.number().optional(),
      /** Share of the MU during which leaves or jaws cover the point. */
      pointCoveredMuPercent: z.number(),
      /** Share of the MU from segments integrated by Clarkson (the rest: plain rectangles, by equivalent square). */
      clarksonMuPercent: z.number(),
      /**
       * Every segment's part of the sum: its mid gantry angle, MU share, depth, Sc, the fluence at the
       * point (1 open, the leaf transmission under the leaves), Sp·TPR and (Clarkson) its scatter part,
       * its dose per MU (with the heterogeneity correction) and its dose for the beam's MU.
       */
      segmentRows: z
        .array(
          z.object({
            gantryDeg: z.number(),
            muShare: z.number(),
            depthCm: z.number(),
            radiologicalDepthCm: z.number().optional(),
            sc: z.number(),
            primaryFluence: z.number(),
            /** The opening's width along the leaves' travel through the point, at the isocenter plane (0: covered; absent in older documents). */
            openWidthCm: z.number().optional(),
            spTpr: z.number(),
            scatterSpTpr: z.number().optional(),
            dosePerMuCGy: z.number(),
            doseCGy: z.number(),
          }),
        )
        .optional(),
    })
    .optional(),
  /** The planning system's own depth data for the point, where the plan carries them, beside ours. */
  planningSystemDepths: z
    .object({
      depthMm: z.number().optional(),
      equivalentDepthMm: z.number().optional(),
      ssdMm: z.number().optional(),
      depthDifferenceMm: z.number().optional(),
      equivalentDepthDifferenceMm: z.number().optional(),
      ssdDifferenceMm: z.number().optional(),
    })
    .optional(),
});
export type Calculation = z.infer<typeof Calculation>;

/**
 * A cause of a beam's deviation: its code (worded by the report), its estimated share of the
 * deviation in percent of dose (signed: the deviation it would make alone), how sure the estimate
 * is, and the numbers it rests on.
 */
export const DeviationCause = z.object({
  code: z.enum([
    'depth',
    'heterogeneity',
    'ssd-ct-vs-plan',
    'gradient',
    'field-edge',
    'leaf-transmission',
    'leaf-end-offset',
    'extended-ssd',
    'machine-alias',
    'table-edge',
    'zero-field',
    'mu-as-typed',
  ]),
  /** For a plan total: the beams whose causes these are. */
  beams: z.array(z.number()).optional(),
  contributionPercent: z.number(),
  /** False when the cause is named but its share could not be estimated (its contribution is then 0). */
  estimated: z.boolean().optional(),
  confidence: z.enum(['measured', 'estimated', 'possible']),
  evidence: z.record(z.string(), z.union([z.number(), z.string()])),
});
export type DeviationCause = z.infer<typeof DeviationCause>;

/** The causes, largest first, and the residual: causes and residual add up to the deviation (in the log, so products add). */
export const Explanation = z.object({
  deviationPercent: z.number(),
  causes: z.array(DeviationCause),
  residualPercent: z.number(),
  /** The residual is larger than every cause: not explained by the causes plumbline knows. */
  unexplained: z.boolean(),
});
export type Explanation = z.infer<typeof Explanation>;

/** A beam the engine gave no dose, with the reason; the point when one was chosen. */
export const NotCheckedBeam = z.object({ ...BeamIdentity, status: z.literal('not checked'), reason: Note, point: CalculationPoint.optional() });
export type NotCheckedBeam = z.infer<typeof NotCheckedBeam>;

/** A beam with its independent dose at its point, the levels of its category and the verdict. */
export const CheckedBeam = z.object({
  ...BeamIdentity,
  status: z.literal('checked'),
  point: CalculationPoint,
  calculation: Calculation,
  category: CaseCategory,
  tolerancePercent: z.number(),
  actionPercent: z.number(),
  fitness: PointFitness,
  suggestedPoint: z
    .object({
      patientMm: z.tuple([z.number(), z.number(), z.number()]),
      independentDoseCGy: z.number(),
      depthCm: z.number(),
      offAxisCm: z.number(),
      clamps: z.array(Clamp),
    })
    .optional(),
  /** "not verified" when there was nothing to compare with at the point (a point of the user's, no dose grid there). */
  verdict: PlanVerdict,
  verdictReasons: z.array(Note),
  /** The deviation the verdict was judged on, and on what basis. */
  judgedDeviationPercent: z.number().optional(),
  judgedOn: z.enum(['beam dose', 'share of the point dose', 'composite of the modulated beams']).optional(),
  /** For a beam not within tolerance: the likely causes of its deviation, largest first, and what is left. */
  explanation: Explanation.optional(),
});
export type CheckedBeam = z.infer<typeof CheckedBeam>;

/** A checked beam before its verdict, which needs the other beams at the same point. */
export type CalculatedBeam = Omit<CheckedBeam, 'verdict' | 'verdictReasons' | 'judgedDeviationPercent' | 'judgedOn'>;

export const BeamCheck = z.discriminatedUnion('status', [CheckedBeam, NotCheckedBeam]);
export type BeamCheck = z.infer<typeof BeamCheck>;

export const PointTotal = z.object({
  pointPatientMm: z.tuple([z.number(), z.number(), z.number()]),
  beams: z.array(z.number()),
  independentDoseCGy: z.number(),
  planningSystemDoseCGy: z.number(),
  deviationPercent: z.number().optional(),
  prescriptionPerFractionCGy: z.number().optional(),
  independentVsPrescriptionPercent: z.number().optional(),
  planningSystemVsPrescriptionPercent: z.number().optional(),
  complete: z.boolean(),
  /** The planning system's own dose grid (RT Dose) at the point, and which summation it is. */
  doseGridCGy: z.number().optional(),
  doseGridSummation: z.string().optional(),
  /** Why the total may differ, from its beams' causes weighed by their share of the planning system's dose there. */
  explanation: Explanation.optional(),
});

export const FractionGroupCheck = z.object({
  number: z.number(),
  fractionsPlanned: z.number().optional(),
  beams: z.array(BeamCheck),
  totals: z.array(PointTotal),
});
export type FractionGroupCheck = z.infer<typeof FractionGroupCheck>;

export const PlanCheck = z.object({
  file: z.string(),
  fileSha256: z.string(),
  planLabel: z.string(),
  planName: z.string().optional(),
  patientId: z.string().optional(),
  /** The patient's name as the plan gives it (DICOM PN: family^given^middle^prefix^suffix). */
  patientName: z.string().optional(),
  sopInstanceUid: z.string(),
  approvalStatus: z.string().optional(),
  machine: z.object({ planName: z.string(), dataName: z.string(), via: z.string() }).optional(),
  fractionGroups: z.array(FractionGroupCheck),
  /** Over the whole course, per point: Σ fractions × dose. */
  courseTotals: z.array(PointTotal),
  verdict: PlanVerdict,
  fullyVerified: z.boolean(),
  issues: z.array(IssueJson),
  /** What the import found questionable but not wrong (each also in the report). */
  importWarnings: z.array(IssueJson),
  warnings: z.array(Note),
});
export type PlanCheck = z.infer<typeof PlanCheck>;
