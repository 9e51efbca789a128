import { z } from 'zod';
import { CaseCategory } from '../model/index.js';

const Level = z
  .object({ tolerancePercent: z.number().positive(), actionPercent: z.number().positive() })
  .strict()
  .refine((l) => l.actionPercent >= l.tolerancePercent, { message: 'the action level must not be below the tolerance' });

/**
 * The clinic's action-level policy: per case category a tolerance (within it: "within tolerance")
 * and an action level (beyond it: "beyond action level"; between the two: "needs review"), and the
 * thresholds that put a beam in a category or flag its point.
 */
export const Policy = z
  .object({
    format: z.literal('plumbline.policy'),
    formatVersion: z.literal(1),
    description: z.string().optional(),
    levels: z
      .record(CaseCategory, Level)
      .refine((r) => CaseCategory.options.every((c) => c in r), { message: `give levels for every category: ${CaseCategory.options.join(', ')}` }),
    classification: z
      .object({
        /** A point farther than this from the central axis makes the case off-axis. */
        offAxisCm: z.number().nonnegative(),
        /** Irradiated equivalent squares below this are small fields. */
        smallFieldCm: z.number().positive(),
        /** SSDs beyond this are large-SSD cases. */
        largeSsdCm: z.number().positive(),
        /** Open area below this fraction of the jaw opening makes the field irregular (heavily blocked). */
        openFractionBelow: z.number().min(0).max(1),
        /** Plan SSD within this of the SAD makes an SSD setup. */
        ssdSetupWithinMm: z.number().nonnegative(),
      })
      .strict(),
    point: z.object({ edgeMarginCm: z.number().nonnegative(), interfaceMarginCm: z.number().nonnegative() }).strict(),
    ct: z
      .object({
        /** The CT's SSD and the plan's may differ by this before it is a finding (bolus, wrong CT, wrong isocenter). */
        ssdToleranceMm: z.number().nonnegative(),
        /** Voxels at or above this HU are the body when no EXTERNAL contour is given. */
        bodyThresholdHu: z.number(),
        /** Densities met on the ray outside this range make the case heterogeneous. */
        waterLikeDensity: z.tuple([z.number(), z.number()]),
      })
      .strict(),
    /** A beam giving less than this share of its point's total dose is judged on its share. */
    lowContributionShare: z.number().min(0).max(1),
  })
  .strict();
export type Policy = z.infer<typeof Policy>;

/**
 * Shipped defaults, in the spirit of AAPM TG-114 (about 2 % for simple cases up to about 5 % for
 * complex ones). The numbers are from memory, not read from the report: every clinic sets its own.
 */
export const DEFAULT_POLICY: Policy = {
  format: 'plumbline.policy',
  formatVersion: 1,
  description: "plumbline defaults in the spirit of AAPM TG-114, from memory; set your clinic's own",
  levels: {
    'on-axis-open': { tolerancePercent: 2, actionPercent: 3 },
    'off-axis-or-wedged': { tolerancePercent: 2.5, actionPercent: 3.5 },
    'irregular-or-small': { tolerancePercent: 3, actionPercent: 4 },
    'large-ssd': { tolerancePercent: 3, actionPercent: 4 },
    heterogeneous: { tolerancePercent: 3.5, actionPercent: 5 },
    modulated: { tolerancePercent: 4, actionPercent: 5 },
  },
  classification: { offAxisCm: 2, smallFieldCm: 4, largeSsdCm: 110, openFractionBelow: 0.8, ssdSetupWithinMm: 5 },
  point: { edgeMarginCm: 1.5, interfaceMarginCm: 1 },
  ct: { ssdToleranceMm: 5, bodyThresholdHu: -400, waterLikeDensity: [0.9, 1.1] },
  lowContributionShare: 0.1,
};
