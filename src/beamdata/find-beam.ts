import type { ElectronBeamModel, MachineModel, PhotonBeamModel, Result } from '../model/index.js';

/** The machine's beam for a nominal energy (and FFF flag); never a neighbouring energy. */
export function findPhotonBeam(machine: MachineModel, energyMV: number, fff = false): Result<PhotonBeamModel> {
  const beam = machine.beams.find((b) => Math.abs(b.nominalEnergyMV - energyMV) < 1e-9 && b.fff === fff);
  if (beam) return { ok: true, value: beam };
  return {
    ok: false,
    issues: [
      {
        severity: 'error',
        code: 'missing-table',
        message: `machine ${machine.name} has no ${energyMV} MV${fff ? ' FFF' : ''} photon beam in its beam data`,
        expected: machine.beams.map((b) => `${b.nominalEnergyMV} MV${b.fff ? ' FFF' : ''}`).join(', '),
        found: `${energyMV} MV${fff ? ' FFF' : ''}`,
      },
    ],
  };
}

/** The machine's electron beam for a nominal energy; never a neighbouring energy. */
export function findElectronBeam(machine: MachineModel, energyMeV: number): Result<ElectronBeamModel> {
  const beam = machine.electronBeams.find((b) => Math.abs(b.nominalEnergyMeV - energyMeV) < 1e-9);
  if (beam) return { ok: true, value: beam };
  return {
    ok: false,
    issues: [
      {
        severity: 'error',
        code: 'missing-table',
        message: `machine ${machine.name} has no ${energyMeV} MeV electron beam in its beam data`,
        expected: machine.electronBeams.map((b) => `${b.nominalEnergyMeV} MeV`).join(', ') || 'no electron beams',
        found: `${energyMeV} MeV`,
      },
    ],
  };
}
