/**
 * Writes the beam data of the invented demo machine (fixtures/demo/beam-data/) from a simple physical
 * model, so the tables are complete and consistent with each other. INVENTED DATA, for the demo and
 * the tests only: it must never be used for a patient.
 *
 * The model, per beam (lengths in cm, r the field side):
 *   TMR(d, r) = exp(−μ (d − dmax)) · (1 + κ (1 − exp(−r/8)) (d − dmax))     for d >= dmax
 *               (primary attenuation times a scatter build-up growing with depth and field)
 *   TMR(d, r) = 1 − (1 − s(r)) (1 − d/dmax)^1.5, s(r) = surface dose fraction  in the build-up region
 *   Sp(r) ∝ 1 + a (1 − exp(−r/6)),  Sc(r) ∝ 1 + b (1 − exp(−r/4)), both 1 for the reference field
 *   PDD from TMR exactly: PDD(d, r, 100) = 100 TMR(d, rd) Sp(rd)/Sp(rdmax) ((100 + dmax)/(100 + d))²
 *   OAR(d, x) = 1 + h x² exp(−d/15) (the horns of a flattened beam, fading with depth)
 *   wedge factor(r) = WF10 (1 + 0.0015 (r − 10)); the 60° wedge also varies with depth
 *   wedge profile (wedged / open) = exp(−g u), g = 0.035 tan(angle) (1 − 0.01 (d − 10)) per cm, u toward the heel
 *   swept (dynamic) wedge factor = 1 / (1 + 0.55 tan(angle) (L/10)^0.7), L the field length along the sweep
 *   swept wedge profile (wedged / open) = exp(−0.04 tan(angle) u), u toward the heel (cm)
 * μ and κ are fitted so the 10 × 10 PDD at SSD 100 cm matches a target at 10 and 20 cm depth:
 * 6 MV 67.5 % and 39.3 % (the values BJR Supplement 25 gives for 6 MV), 10 and 15 MV invented.
 * dmax: 1.5 cm (6 MV) and 2.5 cm (10 MV) are typical handbook values (from memory), 2.9 cm (15 MV)
 * invented.
 *
 * Electrons (6, 9, 12 MeV), per energy E in MeV and cutout side r (cm, at the nominal SSD):
 *   R50 = E/2.33 cm and R90 = E/3.2 cm for 10 × 10 (handbook rules of thumb, from memory), both
 *   shortened for small fields by q(r) = (1 − 0.3 e^(−r/Rp)) / (1 − 0.3 e^(−10/Rp)), Rp = E/2 cm
 *   PDD(d) = 100 [s + (1 − s)(1 − (1 − d/dmax)²)] up to dmax (s the surface dose), beyond it
 *   100 [t + (1 − t) L(d)/L(dmax)] with L the logistic of mid-point R50 and width (R50 − R90)/2.197,
 *   t the bremsstrahlung tail; Se = the applicator's open output × (1 − 0.25 e^(−r/Rp)) / (1 − 0.25 e^(−a/Rp))
 *   for applicator side a; effective SSD = base − 15 e^(−r/5) cm (rising with energy and field).
 * All invented. Run: npm run demo-machine
 */
import { mkdirSync, renameSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { pddFromTpr } from '../src/physics/pdd-tpr.js';

const OUT = fileURLToPath(new URL('../fixtures/demo/beam-data/', import.meta.url));

interface EnergyModel {
  id: string;
  mv: number;
  dmax: number;
  pdd10: number;
  pdd20: number;
  surface: number;
  a: number;
  b: number;
  horn: number;
  wedge10: Record<string, number>;
  tray: number;
  mlcTransmission: number;
  dosimetricLeafGapMm: number;
}

const ENERGIES: EnergyModel[] = [
  {
    id: '6X',
    mv: 6,
    dmax: 1.5,
    pdd10: 67.5,
    pdd20: 39.3,
    surface: 0.45,
    a: 0.09,
    b: 0.07,
    horn: 0.00015,
    wedge10: { W15: 0.82, W30: 0.68, W45: 0.52, W60: 0.39 },
    tray: 0.97,
    mlcTransmission: 0.015,
    dosimetricLeafGapMm: 1.5,
  },
  {
    id: '10X',
    mv: 10,
    dmax: 2.5,
    pdd10: 73.0,
    pdd20: 46.5,
    surface: 0.3,
    a: 0.07,
    b: 0.06,
    horn: 0.00012,
    wedge10: { W15: 0.84, W30: 0.71, W45: 0.56, W60: 0.43 },
    tray: 0.975,
    mlcTransmission: 0.017,
    dosimetricLeafGapMm: 1.7,
  },
  {
    id: '15X',
    mv: 15,
    dmax: 2.9,
    pdd10: 76.5,
    pdd20: 50.0,
    surface: 0.22,
    a: 0.055,
    b: 0.055,
    horn: 0.0001,
    wedge10: { W15: 0.85, W30: 0.73, W45: 0.58, W60: 0.45 },
    tray: 0.978,
    mlcTransmission: 0.018,
    dosimetricLeafGapMm: 1.9,
  },
];

const SSD_CM = 100;
const REFERENCE_FIELD_CM = 10;
const FIELDS_CM = [2, 3, 4, 5, 6, 7, 8, 10, 12, 15, 20, 25, 30, 35, 40, 45, 50];
const SURFACE_FIELDS_CM = [3, 4, 5, 6, 7, 8, 10, 12, 15, 20, 25, 30, 35, 40];
const OFF_AXIS_CM = [0, 1, 2, 3, 4, 5, 6, 8, 10, 12, 14, 16, 18, 20];
const WEDGE_FIELDS_CM = [3, 4, 5, 6, 8, 10, 12, 15, 20];
const WEDGE_POSITIONS_CM = [-10, -8, -6, -4, -2, 0, 2, 4, 6, 8, 10];
const SWEPT_ANGLES_DEG = [10, 15, 20, 25, 30, 45, 60];
const SWEPT_LENGTHS_CM = [4, 5, 6, 8, 10, 12, 15, 20, 25, 30];

const depthsFor = (dmax: number) =>
  [
    ...new Set(
      [0, 0.5, 1, dmax, 2, 2.5, 3, 4, 5, 6, 7, 8, 9, 10, 12, 14, 16, 18, 20, 22, 25, 30, 35].filter((d) => d <= dmax || d > dmax + 0.05).concat(dmax),
    ),
  ].sort((x, y) => x - y);

function tmr(e: EnergyModel, mu: number, kappa: number, d: number, r: number): number {
  if (d < e.dmax) {
    const s = Math.min(0.95, e.surface + 0.004 * r);
    return 1 - (1 - s) * (1 - d / e.dmax) ** 1.5;
  }
  return Math.exp(-mu * (d - e.dmax)) * (1 + kappa * (1 - Math.exp(-r / 8)) * (d - e.dmax));
}

const spRaw = (e: EnergyModel, r: number) => 1 + e.a * (1 - Math.exp(-r / 6));
const scRaw = (e: EnergyModel, r: number) => 1 + e.b * (1 - Math.exp(-r / 4));
/** Sp normalized for the reference field as defined at the surface: 10 cm at SSD 100, i.e. 10·(100 + dmax)/100 at dmax. */
const sp = (e: EnergyModel, r: number) => spRaw(e, r) / spRaw(e, (REFERENCE_FIELD_CM * (SSD_CM + e.dmax)) / SSD_CM);
const sc = (e: EnergyModel, r: number) => scRaw(e, r) / scRaw(e, REFERENCE_FIELD_CM);

function pdd(e: EnergyModel, mu: number, kappa: number, d: number, r: number): number {
  const rd = (r * (SSD_CM + d)) / SSD_CM;
  const rdm = (r * (SSD_CM + e.dmax)) / SSD_CM;
  return pddFromTpr(tmr(e, mu, kappa, d, rd), d, SSD_CM, e.dmax, sp(e, rdm), sp(e, rd));
}

function bisect(f: (x: number) => number, lo: number, hi: number): number {
  let flo = f(lo);
  for (let k = 0; k < 200; k++) {
    const mid = (lo + hi) / 2;
    const fm = f(mid);
    if (Math.sign(fm) === Math.sign(flo)) {
      lo = mid;
      flo = fm;
    } else hi = mid;
  }
  return (lo + hi) / 2;
}

/** μ and κ such that the model's 10 × 10 PDD at 10 and 20 cm equals the targets. */
function fit(e: EnergyModel): { mu: number; kappa: number } {
  const kappaFor = (mu: number) => bisect((k) => pdd(e, mu, k, 10, 10) - e.pdd10, -0.05, 1);
  const mu = bisect((m) => pdd(e, m, kappaFor(m), 20, 10) - e.pdd20, 0.01, 0.2);
  return { mu, kappa: kappaFor(mu) };
}

const f4 = (v: number) => v.toFixed(4);
const HEADER = '# INVENTED demo data (plumbline demo machine), generated by scripts/make-demo-machine.ts: never use for a patient.';

function grid(
  rowsLabel: string,
  rows: number[],
  cols: number[],
  value: (r: number, c: number) => number,
  digits: (v: number) => string,
  note: string,
): string {
  return `${[HEADER, `# ${note}`, [rowsLabel, ...cols].join(','), ...rows.map((r) => [r, ...cols.map((c) => digits(value(r, c)))].join(','))].join('\n')}\n`;
}
function profile(label: string, xs: number[], value: (x: number) => number, note: string): string {
  return `${[HEADER, `# ${note}`, label, ...xs.map((x) => `${x},${f4(value(x))}`)].join('\n')}\n`;
}

function write(rel: string, text: string): void {
  const file = join(OUT, rel);
  mkdirSync(dirname(file), { recursive: true });
  writeFileSync(`${file}.tmp`, text);
  renameSync(`${file}.tmp`, file);
}

const beams = ENERGIES.map((e) => {
  const { mu, kappa } = fit(e);
  const dir = e.id.toLowerCase();
  const depths = depthsFor(e.dmax);
  write(
    `${dir}/pdd.csv`,
    grid(
      'depth_cm\\field_cm',
      depths,
      SURFACE_FIELDS_CM,
      (d, r) => pdd(e, mu, kappa, d, r),
      (v) => v.toFixed(2),
      `PDD (%) at SSD 100 cm vs depth (cm, rows) and square field side at the surface (cm, columns); 100 % at dmax ${e.dmax} cm`,
    ),
  );
  write(
    `${dir}/tmr.csv`,
    grid(
      'depth_cm\\field_cm',
      depths,
      FIELDS_CM,
      (d, r) => tmr(e, mu, kappa, d, r),
      f4,
      `TMR vs depth (cm, rows) and square field side at depth (cm, columns); 1 at dmax ${e.dmax} cm`,
    ),
  );
  write(
    `${dir}/sc.csv`,
    profile('field_cm,sc', FIELDS_CM, (r) => sc(e, r), 'Sc vs collimator equivalent square at the isocenter plane (cm); 1 at 10 x 10'),
  );
  write(
    `${dir}/sp.csv`,
    profile(
      'field_cm,sp',
      FIELDS_CM,
      (r) => sp(e, r),
      `Sp vs equivalent square at dmax (cm); 1 for the reference field (10 x 10 at SSD 100, ${f4((REFERENCE_FIELD_CM * (SSD_CM + e.dmax)) / SSD_CM)} cm at dmax)`,
    ),
  );
  write(
    `${dir}/oar.csv`,
    grid(
      'depth_cm\\offaxis_cm',
      depths.filter((d) => d >= e.dmax),
      OFF_AXIS_CM,
      (d, x) => 1 + e.horn * x * x * Math.exp(-d / 15),
      f4,
      'OAR vs depth (cm, rows) and off-axis distance at depth (cm, columns), open 40 x 40 field',
    ),
  );
  const wedges = Object.entries(e.wedge10).map(([id, wf10]) => {
    const byDepth = id === 'W60';
    const rel = `${dir}/wedge-${id.toLowerCase()}.csv`;
    const wf = (r: number, d = 10) => wf10 * (1 + 0.0015 * (r - 10)) * (byDepth ? 1 + 0.002 * (d - 10) : 1);
    write(
      rel,
      byDepth
        ? grid(
            'depth_cm\\field_cm',
            [e.dmax, 5, 10, 15, 20, 25],
            WEDGE_FIELDS_CM,
            (d, r) => wf(r, d),
            f4,
            `${id} wedge factor vs depth (cm, rows) and collimator equivalent square (cm, columns)`,
          )
        : profile('field_cm,wf', WEDGE_FIELDS_CM, (r) => wf(r), `${id} wedge factor vs collimator equivalent square (cm)`),
    );
    const angle = Number(id.slice(1));
    const profileRel = `${dir}/wedge-${id.toLowerCase()}-profile.csv`;
    write(
      profileRel,
      grid(
        'depth_cm\\toward_heel_cm',
        [e.dmax, 5, 10, 15, 20, 25],
        WEDGE_POSITIONS_CM,
        (d, u) => Math.exp(-0.035 * Math.tan((angle * Math.PI) / 180) * (1 - 0.01 * (d - 10)) * u),
        f4,
        `${id} wedged / open dose ratio vs depth (cm, rows) and position along the wedge axis at the isocenter plane, positive toward the heel (cm, columns)`,
      ),
    );
    return {
      id,
      angleDeg: angle,
      profile: { file: profileRel, units: { depth: 'cm', position: 'cm' }, interpolation: 'bilinear' },
      factor: byDepth
        ? { file: rel, byDepth: true, units: { depth: 'cm', fieldSide: 'cm' } }
        : { file: rel, byDepth: false, units: { fieldSide: 'cm' } },
    };
  });
  write(
    `${dir}/swept-wedge.csv`,
    grid(
      'angle_deg\\length_cm',
      SWEPT_ANGLES_DEG,
      SWEPT_LENGTHS_CM,
      (a, l) => 1 / (1 + 0.55 * Math.tan((a * Math.PI) / 180) * (l / 10) ** 0.7),
      f4,
      'swept (dynamic) wedge factor vs wedge angle (degrees, rows) and field length along the sweep (cm, columns)',
    ),
  );
  write(
    `${dir}/swept-wedge-profile.csv`,
    grid(
      'angle_deg\\toward_heel_cm',
      SWEPT_ANGLES_DEG,
      WEDGE_POSITIONS_CM,
      (a, u) => Math.exp(-0.04 * Math.tan((a * Math.PI) / 180) * u),
      f4,
      'swept (dynamic) wedged / open dose ratio at 10 cm depth vs wedge angle (degrees, rows) and position along the sweep at the isocenter plane, positive toward the heel (cm, columns)',
    ),
  );
  return {
    id: e.id,
    radiationType: 'PHOTON',
    nominalEnergyMV: e.mv,
    fff: false,
    calibration: { ssd0Cm: SSD_CM, d0Cm: e.dmax, doseCGyPerMu: 1, dmaxCm: e.dmax, referenceFieldAt: 'surface', referenceFieldCm: REFERENCE_FIELD_CM },
    pdd: {
      file: `${dir}/pdd.csv`,
      ssdCm: SSD_CM,
      normalizationDepthCm: e.dmax,
      units: { depth: 'cm', fieldSide: 'cm', value: 'percent' },
      interpolation: 'bilinear',
    },
    tpr: { file: `${dir}/tmr.csv`, kind: 'TMR', normalizationDepthCm: e.dmax, units: { depth: 'cm', fieldSide: 'cm' }, interpolation: 'bilinear' },
    sc: { file: `${dir}/sc.csv`, units: { fieldSide: 'cm' }, interpolation: 'bilinear' },
    sp: { file: `${dir}/sp.csv`, units: { fieldSide: 'cm' }, interpolation: 'bilinear', measuredAtDepthCm: e.dmax },
    oar: { file: `${dir}/oar.csv`, offAxisAt: 'depth', units: { depth: 'cm', offAxis: 'cm' }, interpolation: 'bilinear' },
    wedges,
    sweptWedge: {
      factor: { file: `${dir}/swept-wedge.csv`, units: { fieldSide: 'cm' }, interpolation: 'bilinear' },
      profile: { file: `${dir}/swept-wedge-profile.csv`, units: { position: 'cm' }, interpolation: 'bilinear' },
      description: 'a jaw-swept wedge of any angle from 10 to 60 degrees (invented)',
    },
    trays: [{ id: 'BLOCK_TRAY', factor: e.tray }],
    mlcTransmission: e.mlcTransmission,
    dosimetricLeafGapMm: e.dosimetricLeafGapMm,
    collimatorExchangeK: 1.25,
    fitted: { mu, kappa },
  };
});

interface ElectronModel {
  id: string;
  mev: number;
  dmax: number;
  surface: number;
  tail: number;
  ssdEff: number;
}
const ELECTRONS: ElectronModel[] = [
  { id: '6E', mev: 6, dmax: 1.3, surface: 0.78, tail: 0.006, ssdEff: 82 },
  { id: '9E', mev: 9, dmax: 2.0, surface: 0.82, tail: 0.012, ssdEff: 88 },
  { id: '12E', mev: 12, dmax: 2.7, surface: 0.87, tail: 0.02, ssdEff: 92 },
];
const APPLICATORS = [
  { id: 'A06', side: 6, output: 0.972 },
  { id: 'A10', side: 10, output: 1 },
  { id: 'A15', side: 15, output: 1.006 },
  { id: 'A20', side: 20, output: 1.004 },
];
const CUTOUTS_CM = [3, 4, 5, 6, 8, 10, 12, 15, 20];

function electronPdd(e: ElectronModel, d: number, r: number): number {
  const rp = e.mev / 2;
  const q = (1 - 0.3 * Math.exp(-r / rp)) / (1 - 0.3 * Math.exp(-10 / rp));
  const [dmax, r50, r90] = [e.dmax * q, (e.mev / 2.33) * q, (e.mev / 3.2) * q];
  if (d <= dmax) return 100 * (e.surface + (1 - e.surface) * (1 - (1 - d / dmax) ** 2));
  const w = (r50 - r90) / 2.197;
  const logistic = (x: number) => 1 / (1 + Math.exp((x - r50) / w));
  return 100 * (e.tail + (1 - e.tail) * (logistic(d) / logistic(dmax)));
}
const cutoutFactor = (e: ElectronModel, r: number, a: number) => (1 - 0.25 * Math.exp(-r / (e.mev / 2))) / (1 - 0.25 * Math.exp(-a / (e.mev / 2)));

const electronBeams = ELECTRONS.map((e) => {
  const dir = e.id.toLowerCase();
  const depths = Array.from({ length: Math.round((e.mev / 2 + 1.5) / 0.2) + 1 }, (_, i) => Number((0.2 * i).toFixed(1)));
  // Each column's own dmax is a row, so the table holds its 100 %.
  const rows = [
    ...new Set([
      ...depths,
      ...CUTOUTS_CM.map((r) => Number(((e.dmax * (1 - 0.3 * Math.exp(-r / (e.mev / 2)))) / (1 - 0.3 * Math.exp(-10 / (e.mev / 2)))).toFixed(4))),
    ]),
  ].sort((a, b) => a - b);
  write(
    `${dir}/pdd.csv`,
    grid(
      'depth_cm\\cutout_cm',
      rows,
      CUTOUTS_CM,
      (d, r) => electronPdd(e, d, r),
      (v) => v.toFixed(2),
      `electron PDD (%) at SSD 100 cm vs depth (cm, rows) and cutout equivalent square at the nominal SSD (cm, columns); each column 100 % at its own dmax`,
    ),
  );
  const applicators = APPLICATORS.map((a) => {
    const sides = CUTOUTS_CM.filter((r) => r <= a.side);
    write(
      `${dir}/se-${a.id.toLowerCase()}.csv`,
      profile(
        'cutout_cm,se',
        sides,
        (r) => a.output * cutoutFactor(e, r, a.side),
        `Se of applicator ${a.id} vs cutout equivalent square (cm) at the nominal SSD, at each field's own dmax; 1 for A10 open`,
      ),
    );
    write(
      `${dir}/ssd-eff-${a.id.toLowerCase()}.csv`,
      profile(
        'cutout_cm,ssd_eff_cm',
        sides,
        (r) => e.ssdEff - 15 * Math.exp(-r / 5),
        `effective SSD (cm) of applicator ${a.id} vs cutout equivalent square (cm)`,
      ),
    );
    return {
      id: a.id,
      sideCm: a.side,
      outputFactor: { file: `${dir}/se-${a.id.toLowerCase()}.csv`, units: { fieldSide: 'cm' }, interpolation: 'bilinear' },
      effectiveSsdCm: { file: `${dir}/ssd-eff-${a.id.toLowerCase()}.csv`, units: { fieldSide: 'cm' }, interpolation: 'bilinear' },
    };
  });
  return {
    id: e.id,
    radiationType: 'ELECTRON',
    nominalEnergyMeV: e.mev,
    calibration: { ssd0Cm: SSD_CM, d0Cm: e.dmax, doseCGyPerMu: 1, referenceApplicator: 'A10' },
    pdd: { file: `${dir}/pdd.csv`, ssdCm: SSD_CM, units: { depth: 'cm', fieldSide: 'cm', value: 'percent' }, interpolation: 'bilinear' },
    applicators,
  };
});

const manifest = {
  $schema: '../../../src/beamdata/manifest.schema.json',
  format: 'plumbline.beam-data',
  formatVersion: 1,
  dataVersion: 'demo-2026-12-02',
  approval: { commissionedOn: '2026-12-02', approvedOn: '2026-12-02', approvedBy: 'nobody: INVENTED demo data, approved for the demo only' },
  machine: {
    name: 'NG_LINAC1',
    aliases: ['demo'],
    sadCm: 100,
    invented: true,
    wedgeHeel: { atOrientation0: '-Y', atOrientation90: '+X' },
    // An invented machine's invented limits, of the usual size for a linac (common practice, no source).
    limits: { maxFieldSideCm: 40, maxJawPositionCm: 20, maxLeafPositionCm: 20, maxMuPerBeam: 999 },
    clinicalRange: { fieldSideCm: [3, 40], depthCm: [3, 30] },
    description:
      'INVENTED demo machine of the Nowhere General demo scenario; tables generated from a simple physical model by scripts/make-demo-machine.ts. Never use for a patient.',
  },
  beams: beams.map(({ fitted: _fitted, ...b }) => b),
  electronBeams,
};
write('manifest.json', `${JSON.stringify(manifest, null, 2)}\n`);
for (const b of beams) console.log(`${b.id}: mu ${b.fitted.mu.toFixed(5)} /cm, kappa ${b.fitted.kappa.toFixed(5)} /cm`);
