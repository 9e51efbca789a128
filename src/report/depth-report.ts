import { z } from 'zod';
import { CalculationPoint, Note } from '../model/index.js';
import { CAUTION } from './caution.js';
import { noteText, pointText } from './note-text.js';
import { fixed, textTable } from './table.js';

export const DepthRow = z.object({
  beamNumber: z.number(),
  beamName: z.string().optional(),
  controlPointIndex: z.number().optional(),
  gantryAngleDeg: z.number(),
  point: CalculationPoint.pick({ source: true, doseReferenceVia: true, doseReferenceNumber: true, patientMm: true }),
  planSsdMm: z.number().optional(),
  ctSsdAlongAxisMm: z.number().optional(),
  ssdDifferenceMm: z.number().optional(),
  entryPatientMm: z.tuple([z.number(), z.number(), z.number()]).optional(),
  geometricDepthMm: z.number().optional(),
  radiologicalDepthMm: z.number().optional(),
  densityRange: z.tuple([z.number(), z.number()]).optional(),
  nearestInterfaceMm: z.number().optional(),
  planningSystem: z.object({ depthMm: z.number().optional(), equivalentDepthMm: z.number().optional(), ssdMm: z.number().optional() }).optional(),
  problem: Note.optional(),
});
export type DepthRow = z.infer<typeof DepthRow>;

export const DepthDocument = z.object({
  schemaVersion: z.literal(2),
  kind: z.literal('plumbline.depth'),
  tool: z.object({ name: z.literal('plumbline'), version: z.string() }),
  plan: z.string(),
  ct: z.object({
    seriesInstanceUid: z.string(),
    frameOfReferenceUid: z.string(),
    slices: z.number(),
    bodyThresholdHu: z.number(),
    body: z.string(),
    densityTable: z.string(),
  }),
  beams: z.array(DepthRow),
  caution: z.string(),
});
export type DepthDocument = z.infer<typeof DepthDocument>;

const f1 = (v: number | undefined) => fixed(v, 1);

export function depthText(doc: DepthDocument): string[] {
  const rows = doc.beams.map((b) => [
    String(b.beamNumber),
    b.beamName ?? '—',
    b.controlPointIndex === undefined ? '—' : String(b.controlPointIndex),
    f1(b.gantryAngleDeg),
    f1(b.planSsdMm),
    f1(b.ctSsdAlongAxisMm),
    f1(b.ssdDifferenceMm),
    f1(b.geometricDepthMm),
    f1(b.radiologicalDepthMm),
    b.densityRange ? `${b.densityRange[0].toFixed(2)}–${b.densityRange[1].toFixed(2)}` : '—',
    f1(b.nearestInterfaceMm),
    f1(b.planningSystem?.depthMm),
    f1(b.planningSystem?.equivalentDepthMm),
    f1(b.planningSystem?.ssdMm),
    b.problem ? noteText(b.problem) : '',
  ]);
  return [
    `Depths from the CT for ${doc.plan}: series ${doc.ct.seriesInstanceUid} (${doc.ct.slices} slices), body ${doc.ct.body}, densities from ` +
      `${doc.ct.densityTable}`,
    ...textTable(
      [
        'beam',
        'name',
        'cp',
        'gantry',
        'SSD plan mm',
        'SSD CT mm',
        'diff mm',
        'depth mm',
        'radiological mm',
        'density',
        'interface mm',
        'TPS depth',
        'TPS equiv',
        'TPS SSD',
        '',
      ],
      rows,
    ).map((l) => `  ${l}`),
    ...doc.beams
      .filter((b, i) => doc.beams.findIndex((x) => x.beamNumber === b.beamNumber) === i)
      .map(
        (b) =>
          `  beam ${b.beamNumber}: point ${b.point.patientMm.map((v) => v.toFixed(1)).join(', ')} mm ` +
          `(${pointText(b.point)})${b.entryPatientMm ? `; enters at ${b.entryPatientMm.map((v) => v.toFixed(1)).join(', ')} mm` : ''}`,
      ),
    '',
    CAUTION,
  ];
}
