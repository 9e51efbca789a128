import { type Beam, type Issue, type MachineModel, MM_PER_CM, type ReferencedBeam } from '../model/index.js';

type Limits = NonNullable<MachineModel['limits']>;

/**
 * What the beam asks of the machine beyond what its beam data say it can deliver: a meterset, a
 * jaw or a leaf past its travel, a field wider than the largest. Each is an input error: such a plan
 * cannot be delivered as written, and a dose computed from it would only saturate the tables.
 * No limits declared, nothing said here (the import's plausible ranges still hold).
 */
export function machineLimitIssues(beam: Beam, entry: ReferencedBeam, machine: MachineModel): Issue[] {
  const limits = machine.limits;
  if (!limits) return [];
  const out: Issue[] = [];
  const who = { beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}) };
  if (entry.beamMeterset !== undefined && entry.beamMeterset > limits.maxMuPerBeam)
    out.push({
      severity: 'error',
      code: 'out-of-range',
      ...who,
      path: 'BeamMeterset',
      message: `the beam's meterset is beyond what machine ${machine.name} delivers in one beam (its beam data)`,
      expected: `at most ${limits.maxMuPerBeam} MU`,
      found: `${entry.beamMeterset} MU`,
    });
  for (const cp of beam.controlPoints) {
    for (const d of cp.devices) {
      const why = deviceBeyond(d.type, d.positionsMm, limits);
      if (why)
        out.push({
          severity: 'error',
          code: 'out-of-range',
          ...who,
          controlPointIndex: cp.index,
          path: 'LeafJawPositions',
          message: `${d.type} ${why.what} is beyond machine ${machine.name}'s limit (its beam data)`,
          expected: why.expected,
          found: why.found,
        });
    }
  }
  // One line per kind of excess: the same jaw past its travel at 178 control points is one problem.
  return out.filter((i, k) => out.findIndex((j) => j.message === i.message) === k);
}

function deviceBeyond(type: string, positionsMm: readonly number[], limits: Limits): { what: string; expected: string; found: string } | undefined {
  const isLeaf = type === 'MLCX' || type === 'MLCY';
  const maxCm = isLeaf ? limits.maxLeafPositionCm : limits.maxJawPositionCm;
  const farthestCm = Math.max(...positionsMm.map((p) => Math.abs(p))) / MM_PER_CM;
  if (farthestCm > maxCm)
    return { what: isLeaf ? 'leaf end' : 'jaw edge', expected: `within ${maxCm} cm of the central axis`, found: `${farthestCm} cm` };
  if (!isLeaf && positionsMm.length === 2) {
    const sideCm = (positionsMm[1]! - positionsMm[0]!) / MM_PER_CM;
    if (sideCm > limits.maxFieldSideCm) return { what: 'opening', expected: `at most ${limits.maxFieldSideCm} cm`, found: `${sideCm} cm` };
  }
  return undefined;
}
