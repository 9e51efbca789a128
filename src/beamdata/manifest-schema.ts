import { z } from 'zod';

/**
 * The machine manifest: one JSON file naming the machine and, per beam, its calibration and the CSV
 * files of its commissioning tables, with every unit declared. Bump MANIFEST_FORMAT_VERSION on any
 * incompatible change; `npm run schemas` regenerates the JSON Schema for editors.
 */
export const MANIFEST_FORMAT_VERSION = 1;

const LengthUnit = z.enum(['cm', 'mm']).describe('unit of a length axis');
const positive = z.number().finite().positive();

const Clamp = z
  .object({
    rowsBelow: z.number().nonnegative().optional(),
    rowsAbove: z.number().nonnegative().optional(),
    columnsBelow: z.number().nonnegative().optional(),
    columnsAbove: z.number().nonnegative().optional(),
  })
  .strict()
  .describe('how far (in the axis unit) beyond each edge a lookup may use the edge value; each such clamp is reported');

const tableBase = {
  file: z.string().min(1).describe('CSV file, relative to the manifest'),
  interpolation: z.enum(['bilinear', 'log-linear-rows']).default('bilinear'),
  clamp: Clamp.optional(),
};

const DepthFieldTable = z.object({ ...tableBase, units: z.object({ depth: LengthUnit, fieldSide: LengthUnit }).strict() }).strict();

export const PddTable = z
  .object({
    ...tableBase,
    units: z.object({ depth: LengthUnit, fieldSide: LengthUnit, value: z.enum(['percent', 'fraction']) }).strict(),
    ssdCm: positive.describe('SSD at which the PDD was measured'),
    normalizationDepthCm: positive.describe('depth where the table is 100 % (usually dmax)'),
  })
  .strict()
  .describe('PDD vs depth (rows) and field side at the surface (columns)');

export const TprTable = DepthFieldTable.extend({
  kind: z.enum(['TPR', 'TMR']),
  normalizationDepthCm: positive.describe('depth where the table is 1 (dmax for TMR)'),
})
  .strict()
  .describe('TPR or TMR vs depth (rows) and field side at depth (columns)');

export const FieldProfile = z
  .object({ ...tableBase, units: z.object({ fieldSide: LengthUnit }).strict() })
  .strict()
  .describe('a factor vs equivalent square field side: header row of labels, then "side, value" rows');

/** Sp or Scp: a field profile measured at a stated depth (d0 when not stated). */
export const ScatterProfile = z
  .object({
    ...tableBase,
    units: z.object({ fieldSide: LengthUnit }).strict(),
    measuredAtDepthCm: positive
      .optional()
      .describe('the depth the factor was measured at, cm; d0 when absent. Another depth is converted to d0 through the TPR table'),
  })
  .strict()
  .describe('a scatter factor vs equivalent square field side at its measurement depth: header row of labels, then "side, value" rows');

export const OarTable = z
  .object({
    ...tableBase,
    units: z.object({ depth: LengthUnit, offAxis: LengthUnit }).strict(),
    offAxisAt: z.enum(['depth', 'isocenter-plane']).describe('whether off-axis distances are measured at depth or projected to the isocenter plane'),
  })
  .strict();

export const WedgeTable = z
  .object({
    id: z.string().min(1).describe('the Wedge ID as the plan names it'),
    angleDeg: z.number().finite().positive(),
    factor: z.union([
      z.object({ ...tableBase, byDepth: z.literal(false), units: z.object({ fieldSide: LengthUnit }).strict() }).strict(),
      z.object({ ...tableBase, byDepth: z.literal(true), units: z.object({ depth: LengthUnit, fieldSide: LengthUnit }).strict() }).strict(),
    ]),
    profile: z
      .object({ ...tableBase, units: z.object({ depth: LengthUnit, position: LengthUnit }).strict() })
      .strict()
      .optional()
      .describe(
        'wedged / open dose ratio vs depth (rows) and position along the wedge axis at the isocenter plane, ' +
          'positive toward the heel (columns); 1 on the central axis',
      ),
  })
  .strict();

export const SweptWedge = z
  .object({
    factor: z
      .object({ ...tableBase, units: z.object({ fieldSide: LengthUnit }).strict() })
      .strict()
      .describe('wedge factor vs wedge angle in degrees (rows) and the field length along the swept direction (columns)'),
    profile: z
      .object({ ...tableBase, units: z.object({ position: LengthUnit }).strict() })
      .strict()
      .optional()
      .describe(
        'wedged / open dose ratio vs wedge angle in degrees (rows) and position along the sweep at the isocenter plane, ' +
          'positive toward the heel (columns), at the reference depth; 1 on the central axis',
      ),
    description: z.string().optional(),
  })
  .strict()
  .describe('a wedge made by a jaw sweeping during delivery (Wedge Type DYNAMIC in the plan), any angle from one table');

export const PhotonBeamEntry = z
  .object({
    id: z.string().min(1).describe('e.g. 6X'),
    radiationType: z.literal('PHOTON'),
    nominalEnergyMV: positive,
    fff: z.boolean().default(false),
    calibration: z
      .object({
        ssd0Cm: positive,
        d0Cm: positive,
        doseCGyPerMu: positive.describe("D'0: dose per MU at d0 for the reference field"),
        dmaxCm: positive,
        referenceFieldAt: z.enum(['surface', 'normalization-depth']),
        referenceFieldCm: positive.default(10),
      })
      .strict(),
    pdd: z.union([PddTable, z.literal('derive-from-tpr')]),
    tpr: z.union([TprTable, z.literal('derive-from-pdd')]),
    sc: FieldProfile,
    sp: ScatterProfile.optional(),
    scp: ScatterProfile.optional().describe('total scatter factor; Sp = Scp / Sc when sp is not given'),
    oar: OarTable.optional(),
    wedges: z.array(WedgeTable).default([]),
    sweptWedge: SweptWedge.optional(),
    trays: z.array(z.object({ id: z.string().min(1), factor: z.number().finite().positive().max(1) }).strict()).default([]),
    mlcTransmission: z.number().finite().min(0).max(1).optional(),
    dosimetricLeafGapMm: z
      .number()
      .finite()
      .min(0)
      .max(5)
      .optional()
      .describe('dosimetric leaf gap, mm at the isocenter plane: each open leaf pair is widened by it (the rounded leaf ends)'),
    collimatorExchangeK: positive.optional().describe('collimator-exchange constant k for the Sc equivalent square'),
  })
  .strict()
  .refine((b) => b.pdd !== 'derive-from-tpr' || b.tpr !== 'derive-from-pdd', { message: 'PDD and TPR cannot both be derived', path: ['tpr'] })
  .refine((b) => (b.sp === undefined) !== (b.scp === undefined), { message: 'give exactly one of sp and scp', path: ['sp'] })
  .refine(
    (b) => {
      const at = (b.sp ?? b.scp)?.measuredAtDepthCm;
      return at === undefined || Math.abs(at - b.calibration.d0Cm) < 1e-9 || b.tpr !== 'derive-from-pdd';
    },
    { message: 'Sp (or Scp) measured at a depth other than d0 is converted through the TPR table: give one', path: ['tpr'] },
  );

export const ElectronPddTable = z
  .object({
    ...tableBase,
    units: z.object({ depth: LengthUnit, fieldSide: LengthUnit, value: z.enum(['percent', 'fraction']) }).strict(),
    ssdCm: positive.describe('SSD at which the PDD was measured (the nominal SSD)'),
  })
  .strict()
  .describe('electron PDD vs depth (rows) and cutout equivalent square at the nominal SSD (columns), each column 100 % at its own dmax');

export const ApplicatorEntry = z
  .object({
    id: z.string().min(1).describe('the Applicator ID as the plan names it'),
    sideCm: positive.describe("the open applicator's field side at the nominal SSD"),
    outputFactor: FieldProfile.describe(
      "Se vs cutout equivalent square at the nominal SSD (cm), at each field's own dmax; 1 for the reference applicator, open",
    ),
    effectiveSsdCm: z.union([positive, FieldProfile]).describe('effective (virtual) SSD: one value, or a profile vs cutout equivalent square'),
  })
  .strict();

export const ElectronBeamEntry = z
  .object({
    id: z.string().min(1).describe('e.g. 9E'),
    radiationType: z.literal('ELECTRON'),
    nominalEnergyMeV: positive,
    calibration: z
      .object({
        ssd0Cm: positive.describe('the nominal SSD of the applicators'),
        d0Cm: positive.describe('normalization depth (dmax of the reference applicator)'),
        doseCGyPerMu: positive.describe("D'0: dose per MU at d0 for the reference applicator, open, at the nominal SSD"),
        referenceApplicator: z.string().min(1),
      })
      .strict(),
    pdd: ElectronPddTable,
    applicators: z.array(ApplicatorEntry).min(1),
  })
  .strict()
  .refine((b) => b.applicators.some((a) => a.id === b.calibration.referenceApplicator), {
    message: 'the reference applicator must be one of the applicators',
    path: ['calibration', 'referenceApplicator'],
  });

const IsoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD');

/** The machine's own limits, in the isocenter plane (IEC 61217 BEAM LIMITING DEVICE positions). */
export const MachineLimits = z
  .object({
    maxFieldSideCm: positive.describe('the largest opening of either jaw pair (cm at the isocenter plane)'),
    maxJawPositionCm: positive.describe('the largest distance of a jaw edge from the central axis, on either side (cm)'),
    maxLeafPositionCm: positive.describe('the largest distance of an MLC leaf end from the central axis, on either side (cm)'),
    maxMuPerBeam: positive.describe('the largest meterset one beam may deliver (MU)'),
  })
  .strict();

export const Manifest = z
  .object({
    $schema: z.string().optional().describe('path of the JSON Schema, for editors'),
    format: z.literal('plumbline.beam-data'),
    formatVersion: z.literal(MANIFEST_FORMAT_VERSION),
    dataVersion: z.string().min(1).describe("the clinic's own version of this data set (shown with every result)"),
    approval: z
      .object({
        commissionedOn: IsoDate.optional().describe('when the data were measured (commissioning), YYYY-MM-DD'),
        approvedOn: IsoDate.describe('when a qualified medical physicist approved them for clinical use, YYYY-MM-DD'),
        approvedBy: z.string().min(1).describe('who approved them (name and role)'),
      })
      .strict()
      .optional()
      .describe('who approved these data for use, and when: shown with every result'),
    machine: z
      .object({
        name: z.string().min(1),
        aliases: z.array(z.string().min(1)).default([]).describe('other names a plan may use (Treatment Machine Name)'),
        sadCm: positive,
        invented: z.boolean().default(false).describe('true for demonstration data that must never be used for a patient'),
        description: z.string().optional(),
        wedgeHeel: z
          .object({ atOrientation0: z.enum(['+Y', '-Y']), atOrientation90: z.enum(['+X', '-X']) })
          .strict()
          .optional()
          .describe(
            "where a wedge's heel (thick end) points in the BEAM LIMITING DEVICE frame at the plan's Wedge Orientation 0 and 90 degrees, " +
              'as the clinic verified with its planning system; needed by wedge profiles',
          ),
        clinicalRange: z
          .object({
            fieldSideCm: z.tuple([positive, positive]).describe('the smallest and largest square field side the clinic treats with, cm'),
            depthCm: z.tuple([z.number().finite().min(0), positive]).describe('the shallowest and deepest photon point depth the clinic checks, cm'),
          })
          .strict()
          .optional()
          .describe(
            "the field sides and depths the clinic treats: beams validate warns where a photon table's first and last rows and columns do not cover them",
          ),
        limits: MachineLimits.optional().describe(
          'what the machine can deliver (from its specification, as the clinic accepted it): a plan beyond them is refused as an input error',
        ),
      })
      .strict(),
    beams: z.array(PhotonBeamEntry).default([]),
    electronBeams: z.array(ElectronBeamEntry).default([]),
  })
  .strict()
  .refine((m) => m.beams.length + m.electronBeams.length > 0, { message: 'give at least one photon or electron beam', path: ['beams'] })
  .refine((m) => !!m.machine.wedgeHeel || !m.beams.some((b) => b.wedges.some((w) => w.profile)), {
    message: 'wedge profiles need machine.wedgeHeel (where the heel points at Wedge Orientation 0 and 90)',
    path: ['machine', 'wedgeHeel'],
  });

export type Manifest = z.infer<typeof Manifest>;
export type PhotonBeamEntry = z.infer<typeof PhotonBeamEntry>;
export type ElectronBeamEntry = z.infer<typeof ElectronBeamEntry>;
