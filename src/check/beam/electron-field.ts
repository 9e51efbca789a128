import { axisAlignedRectangle, polygonArea, type Polygon } from '../../geometry/index.js';
import { type ElectronBeamModel, type ElectronPointInput, MM_PER_CM, note, type Note } from '../../model/index.js';
import { type BeamCheckContext, type Stopped, stopNotChecked, stopRefused } from './context.js';

/** An electron beam's applicator and cutout as the physics takes them. */
export interface ElectronField {
  readonly applicator: ElectronBeamModel['applicators'][number];
  /** The cutout outline at the nominal SSD (mm), when the beam has one. */
  readonly outline?: Polygon;
  readonly rectangular: boolean;
  readonly field: ElectronPointInput['field'];
  /** The isocenter plane to the nominal SSD, and that SSD (mm). */
  readonly toNominal: number;
  readonly nominalSsdMm: number;
  /** How the cutout was taken (without the effective SSD, added once the dose is known). */
  readonly cutout: Note;
}

/**
 * The applicator from the plan and the cutout (the beam's APERTURE block) as a rectangle (square-root
 * rule) or its equal-area square. An applicator missing from the beam data refuses the plan; a
 * beam without one, with shielding blocks or with a cutout larger than its applicator is not checked.
 */
export function electronField(ctx: BeamCheckContext, data: ElectronBeamModel, sadMm: number): ElectronField | Stopped {
  const { beam, machine } = ctx;
  const applicatorId = beam.applicators[0]?.id;
  if (applicatorId === undefined) return stopNotChecked(ctx, 'electron-no-applicator');
  const applicator = data.applicators.find((a) => a.id === applicatorId);
  if (!applicator) {
    return stopRefused(ctx, [
      {
        severity: 'error',
        code: 'missing-table',
        message: `the beam data of ${machine.name} ${data.id} have no applicator "${applicatorId}"`,
        expected: data.applicators.map((a) => a.id).join(', '),
        found: applicatorId,
      },
    ]);
  }
  const cutouts = beam.blocks.filter((b) => b.type === 'APERTURE');
  if (beam.blocks.length > cutouts.length || cutouts.length > 1) return stopNotChecked(ctx, 'electron-blocks');
  // The cutout outline is given at the isocenter plane; Se and PDD are tabulated at the nominal SSD.
  const toNominal = (data.calibration.ssd0Cm * MM_PER_CM) / sadMm;
  const outline: Polygon | undefined = cutouts[0]?.outlineMm.map(([x, y]) => [x * toNominal, y * toNominal] as const);
  const nominalSsdMm = data.calibration.ssd0Cm * MM_PER_CM;
  const base = { applicator, toNominal, nominalSsdMm, rectangular: false };
  if (!outline) {
    return {
      ...base,
      field: { kind: 'equivalent-square', sideCm: applicator.sideCm, method: 'the open applicator' },
      cutout: note('electron-cutout', { cutout: 'none', applicatorId, applicatorSideCm: applicator.sideCm }),
    };
  }
  const xs = outline.map((p) => p[0]);
  const ys = outline.map((p) => p[1]);
  const spanCm = Math.max(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys)) / MM_PER_CM;
  const rectangle = axisAlignedRectangle(outline);
  const field: ElectronPointInput['field'] = rectangle
    ? { kind: 'rectangle', xCm: rectangle.x / MM_PER_CM, yCm: rectangle.y / MM_PER_CM }
    : { kind: 'equivalent-square', sideCm: Math.sqrt(polygonArea(outline)) / MM_PER_CM, method: 'equal area' };
  if (spanCm > applicator.sideCm + 0.5) return stopNotChecked(ctx, 'cutout-too-large', { spanCm, applicatorId, applicatorSideCm: applicator.sideCm });
  const cutout =
    field.kind === 'rectangle'
      ? note('electron-cutout', { cutout: 'rectangle', xCm: field.xCm, yCm: field.yCm })
      : note('electron-cutout', { cutout: 'shaped', vertices: outline.length, sideCm: field.sideCm });
  return { ...base, outline, rectangular: !!rectangle, field, cutout };
}
