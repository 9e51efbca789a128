import type { CheckedBeam, DeviationCause, PhotonBeamModel } from '../../model/index.js';
import { mayneordFactor, pddAt, projectFieldCm } from '../../physics/index.js';
import { sensitivity } from './shared.js';

/**
 * An SSD beyond the policy's large-SSD limit: the dose there rests on the inverse square and on
 * how the PDD is carried to that SSD. Where the beam data hold a PDD table, the difference between
 * carrying it by the Mayneord F factor (inverse square only, as a simpler model does) and by TPR
 * (as plumbline does) is the sensitivity; otherwise the cause is named without a share.
 */
export function extendedSsdCause(b: CheckedBeam, data: PhotonBeamModel | undefined, largeSsdCm: number, sadCm: number): DeviationCause | undefined {
  const c = b.calculation;
  if (!(c.ssdCm > largeSsdCm) || b.radiationType !== 'PHOTON') return undefined;
  const differs = data?.pdd ? mayneordAgainstTprPercent(data, c.depthCm, projectFieldCm(c.irradiatedSquareCm, sadCm, c.ssdCm), c.ssdCm) : undefined;
  const evidence = { ssdCm: c.ssdCm, largeSsdCm, ...(differs !== undefined ? { mayneordAgainstTprPercent: differs } : {}) };
  if (differs === undefined || !Number.isFinite(differs))
    return { code: 'extended-ssd', contributionPercent: 0, estimated: false, confidence: 'possible', evidence };
  const contribution = sensitivity(differs);
  return contribution === undefined ? undefined : { code: 'extended-ssd', contributionPercent: contribution, confidence: 'possible', evidence };
}

/** PDD at SSD f by the Mayneord F factor from the table's SSD, against the same by TPR (percent). */
function mayneordAgainstTprPercent(data: PhotonBeamModel, depthCm: number, surfaceSideCm: number, ssdCm: number): number {
  const f0 = data.pdd!.ssdCm;
  const d0 = data.calibration.d0Cm;
  const atF0 = pddAt(data, depthCm, surfaceSideCm, f0, []);
  const byMayneord = atF0 * mayneordFactor(f0, ssdCm, depthCm, d0);
  return 100 * (byMayneord / pddAt(data, depthCm, surfaceSideCm, ssdCm, []) - 1);
}

/**
 * The plan names another machine than the beam data's, matched through an alias: if the two are
 * not dosimetrically the same machine, every beam differs by their outputs. Named, not estimated.
 */
export function machineAliasCause(via: string | undefined, planMachine: string | undefined, dataMachine: string): DeviationCause | undefined {
  if (!via || via === 'same name') return undefined;
  return {
    code: 'machine-alias',
    contributionPercent: 0,
    estimated: false,
    confidence: 'possible',
    evidence: { planMachine: planMachine ?? '', beamData: dataMachine, via },
  };
}
