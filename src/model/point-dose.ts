import type { Issue, Result } from './issue.js';
import type { LookupNote } from './beam-model.js';

/** A point calculation for one photon beam, everything in cm. */
export interface PhotonPointInput {
  /** SSD: PDD-based with the SSD factor; SAD: TPR-based with the point's distance from the source. */
  readonly setup: 'SSD' | 'SAD';
  /** Jaw opening (X × Y) projected to the isocenter plane: sets Sc (and the wedge factor's field). */
  readonly collimatorFieldCm: { readonly x: number; readonly y: number };
  /** Equivalent square of the irradiated field (jaws ∩ MLC ∩ blocks) at the isocenter plane; the jaws when absent. */
  readonly irradiatedSquareCm?: number;
  readonly depthCm: number;
  readonly ssdCm: number;
  /** Distance of the point from the central axis, at its depth. */
  readonly offAxisCm?: number;
  readonly wedgeId?: string;
  /**
   * With a wedge that has a profile (physical, or swept with a swept-wedge profile): the point's
   * position along the wedge axis at the isocenter plane, positive toward the heel.
   */
  readonly towardHeelCm?: number;
  /** A jaw-swept wedge: its angle and the field length along the sweep at the isocenter plane. */
  readonly sweptWedge?: { readonly angleDeg: number; readonly fieldLengthCm: number };
  readonly trayId?: string;
  /**
   * For an irregular field in an SAD setup, the sectors around the point: Sp·TPR then comes from
   * Clarkson integration instead of the equivalent square.
   */
  readonly clarksonSectors?: readonly ClarksonSector[] | ClarksonRings;
  /** With Clarkson sectors: the fluence at the point itself (1 open, the leaf transmission under the leaves). */
  readonly primaryWeight?: number;
}

/**
 * The rings of every sector around the point in flat arrays (cm at the point's depth): sector i's
 * rings are entries start[i] to start[i + 1] − 1, outward, each with its weight (1 open, a
 * transmission where blocked, 0 beyond the jaws). The form the geometry hands over for MLC fields.
 */
export interface ClarksonRings {
  readonly start: readonly number[];
  readonly outerCm: readonly number[];
  readonly weight: readonly number[];
}

/**
 * One sector around the point: where it crosses the field outline (cm, at the point's depth),
 * alternately leaving and re-entering the opening, and where the jaws end it (beyond: nothing).
 * Between a leaving and the next entering crossing, inside the jaws, the leaves transmit.
 */
export interface ClarksonSector {
  readonly crossingsCm: readonly number[];
  readonly jawLimitCm?: number;
}

/**
 * One factor of the product, with the arguments it was looked up at (cm), so a report can write it
 * as a physicist does: `Sp(10.15 cm)`, `PDD(10 cm, 10 cm, SSD 100 cm)/100`.
 *   D0: []   Sc, Sp: [side]   PDD: [depth, side at surface, SSD]   TPR: [depth, side at depth]
 *   SpTPR (Clarkson): [depth, sectors, Sp(0), TPR(d, 0)]
 *   MCI (modulated beams): [segments, sectors], the MU-weighted sum of Sc·Sp·TPR·ISF·OAR over the segments
 *   Se (electrons): [side] or, by the square-root rule, [X, Y]; name: the applicator. Electron PDD by the
 *   square-root rule: [depth, X, Y, SSD], name 'square-root'
 *   WP (wedge profile): [depth, position toward the heel at the isocenter plane]; WF of a swept wedge: [field length], name 'swept N°'
 *   ISF: [numerator distance, denominator distance]   OAR: [depth, off-axis]   WF: [side] or [depth, side]   TF: []
 * `name`: TPR or TMR; the OAR's distance convention; the wedge or tray ID.
 */
export interface Factor {
  readonly key: 'D0' | 'Sc' | 'Sp' | 'PDD' | 'TPR' | 'SpTPR' | 'ISF' | 'OAR' | 'WF' | 'WP' | 'TF' | 'MCI' | 'Se';
  readonly value: number;
  readonly args: readonly number[];
  readonly name?: string;
}

export interface PhotonPointResult {
  readonly setup: 'SSD' | 'SAD';
  readonly dosePerMuCGy: number;
  /** Their product is dosePerMuCGy. */
  readonly factors: readonly Factor[];
  readonly geometry: {
    readonly sourceToPointCm: number;
    readonly collimatorSquareCm: number;
    readonly surfaceSquareCm: number;
    readonly squareAtD0Cm: number;
    readonly squareAtDepthCm: number;
    readonly offAxisCm: number;
  };
  /** Lookups clamped to a table edge, as the manifest allowed: reported with every result. */
  readonly clamps: readonly LookupNote[];
}

export type PhotonPointOutcome = Result<PhotonPointResult>;

/** A point calculation for one electron beam (AAPM TG-71), everything in cm. */
export interface ElectronPointInput {
  readonly applicatorId: string;
  /**
   * The cutout (or the open applicator) at the nominal SSD: a rectangle X × Y, whose Se and PDD follow
   * the square-root rule, or any other shape by its equivalent square (and how it was found).
   */
  readonly field:
    | { readonly kind: 'rectangle'; readonly xCm: number; readonly yCm: number }
    | { readonly kind: 'equivalent-square'; readonly sideCm: number; readonly method: string };
  readonly depthCm: number;
  readonly ssdCm: number;
}

export interface ElectronPointResult {
  readonly dosePerMuCGy: number;
  readonly factors: readonly Factor[];
  /** SSD beyond the nominal SSD (the air gap), and the effective SSD used for it. */
  readonly airGapCm: number;
  readonly effectiveSsdCm: number;
  /** The field's equivalent square (the geometric mean of X and Y for a rectangle). */
  readonly fieldSideCm: number;
  readonly clamps: readonly LookupNote[];
}

export type ElectronPointOutcome =
  | { readonly ok: true; readonly value: ElectronPointResult }
  | { readonly ok: false; readonly issues: readonly Issue[] };
