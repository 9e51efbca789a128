import type { Beam, MachineModel, PhotonBeamModel, Wedge, WedgeData } from '../../model/index.js';
import { type BeamCheckContext, type Stopped, stopNotChecked, stopRefused } from './context.js';

/** The beam modifiers of a static photon beam, each found in the beam data. */
export interface Modifiers {
  /** The wedge in the beam at its first control point, of either kind. */
  readonly wedgeIn?: Wedge;
  /** A physical wedge and its data (factor, profile). */
  readonly physical?: { readonly wedge: Wedge; readonly data: WedgeData };
  /** A jaw-swept (dynamic) wedge: its angle and the jaw axis it sweeps along. */
  readonly swept?: { readonly wedge: Wedge; readonly angleDeg: number; readonly axis: 'X' | 'Y' };
  readonly trayId?: string;
}

/**
 * The one place that decides what a modifier the beam data lack means: a wedge, swept-wedge table
 * or tray missing from the beam data refuses the plan (an input error: the data must be completed
 * or the plan corrected); a swept wedge whose geometry the engine cannot use is not checked.
 */
export function beamModifiers(ctx: BeamCheckContext, data: PhotonBeamModel): Modifiers | Stopped {
  const { beam, machine } = ctx;
  const cp0 = beam.controlPoints[0]!;
  const wedgeIn = beam.wedges.find((w) => cp0.wedgePositions.some((p) => p.wedgeNumber === w.number && p.position === 'IN'));
  const missing = (what: string, expected: string, found: string) =>
    stopRefused(ctx, [
      {
        severity: 'error',
        code: 'missing-table',
        message: `the beam data of ${machine.name} ${data.id} have no ${what}`,
        expected,
        found,
      },
    ]);
  let swept: Modifiers['swept'];
  let physical: Modifiers['physical'];
  if (wedgeIn?.type === 'DYNAMIC') {
    if (!data.sweptWedge) return missing(`swept-wedge table for the dynamic wedge "${wedgeIn.id ?? wedgeIn.number}"`, 'a sweptWedge table', 'none');
    const axis = sweepAxis(wedgeIn.orientationDeg);
    if (wedgeIn.angleDeg === undefined) return stopNotChecked(ctx, 'swept-wedge-no-angle');
    if (axis === undefined) return stopNotChecked(ctx, 'swept-wedge-orientation', { orientationDeg: wedgeIn.orientationDeg });
    swept = { wedge: wedgeIn, angleDeg: wedgeIn.angleDeg, axis };
  } else if (wedgeIn) {
    const found = data.wedges.find((w) => w.id === wedgeIn.id);
    if (!found)
      return missing(
        `wedge "${wedgeIn.id ?? wedgeIn.number}"`,
        data.wedges.map((w) => w.id).join(', ') || 'no wedges',
        wedgeIn.id ?? String(wedgeIn.number),
      );
    physical = { wedge: wedgeIn, data: found };
  }
  const trayId = beam.blocks.length ? beam.blocks[0]!.trayId : undefined;
  if (trayId !== undefined && !data.trays.some((t) => t.id === trayId))
    return missing(`tray "${trayId}"`, data.trays.map((t) => t.id).join(', ') || 'no trays', trayId);
  return {
    ...(wedgeIn ? { wedgeIn } : {}),
    ...(physical ? { physical } : {}),
    ...(swept ? { swept } : {}),
    ...(trayId !== undefined ? { trayId } : {}),
  };
}

/** The jaw axis a dynamic wedge sweeps along: its orientation 0/180 along Y, 90/270 along X. */
function sweepAxis(orientationDeg: number | undefined): 'X' | 'Y' | undefined {
  if (orientationDeg === undefined) return undefined;
  const o = ((orientationDeg % 360) + 360) % 360;
  return [0, 180].some((a) => Math.abs(o - a) < 0.5) ? 'Y' : [90, 270].some((a) => Math.abs(o - a) < 0.5) ? 'X' : undefined;
}

/** The heel's direction (unit, BEAM LIMITING DEVICE frame) at a wedge orientation, from the beam data's convention. */
export function heelDirection(machine: MachineModel, orientationDeg: number | undefined): [number, number] | undefined {
  if (!machine.wedgeHeel || orientationDeg === undefined) return undefined;
  const o = ((orientationDeg % 360) + 360) % 360;
  const y = machine.wedgeHeel.atOrientation0 === '+Y' ? 1 : -1;
  const x = machine.wedgeHeel.atOrientation90 === '+X' ? 1 : -1;
  const near = (a: number) => Math.abs(o - a) < 0.5 || Math.abs(o - a - 360) < 0.5;
  return near(0) ? [0, y] : near(180) ? [0, -y] : near(90) ? [x, 0] : near(270) ? [-x, 0] : undefined;
}

/** The first control point with each jaw at its widest over the beam (a swept wedge's full field). */
export function jawEnvelope(beam: Beam): Beam['controlPoints'][number] {
  const cps = beam.controlPoints;
  const jaw = (t: string) => t === 'X' || t === 'Y' || t === 'ASYMX' || t === 'ASYMY';
  const devices = cps[0]!.devices.map((d) => {
    if (!jaw(d.type)) return d;
    const all = cps.map((c) => c.devices.find((x) => x.type === d.type)?.positionsMm ?? d.positionsMm);
    return { type: d.type, positionsMm: [Math.min(...all.map((p) => p[0]!)), Math.max(...all.map((p) => p[1]!))] };
  });
  return { ...cps[0]!, devices };
}
