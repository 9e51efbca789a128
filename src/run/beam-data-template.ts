/**
 * The files of a new machine's beam data, for the physicist to fill: a manifest whose numbers are
 * left null, and CSV tables whose headers, units and axes are written and whose values are empty.
 * `beams validate` then lists what is still to fill, file by file and cell by cell. The grids are
 * those of a usual commissioning (common practice, no source); rows or columns may be added.
 */
export interface TemplateRequest {
  readonly machine: string;
  readonly photonsMV: readonly number[];
  readonly electronsMeV: readonly number[];
  readonly applicators: readonly { readonly id: string; readonly sideCm: number }[];
}

export interface TemplateFile {
  /** Relative to the output folder. */
  readonly path: string;
  readonly content: string;
}

const PHOTON_DEPTHS_CM = [0, 0.5, 1, 1.5, 2, 2.5, 3, 4, 5, 6, 7, 8, 9, 10, 12, 14, 16, 18, 20, 22, 25, 30];
const PHOTON_FIELDS_CM = [3, 4, 5, 6, 8, 10, 12, 15, 20, 25, 30, 35, 40];
const OAR_DEPTHS_CM = [5, 10, 15, 20, 25, 30];
const OFF_AXIS_CM = [0, 1, 2, 3, 4, 5, 6, 8, 10, 12, 14, 16, 18, 20];
const CUTOUTS_CM = [3, 4, 5, 6, 8, 10, 12, 15, 20, 25];

const NOTE = '# To fill with the clinic\'s own commissioned, validated data; every blank cell is reported by "plumbline beams validate".';

/** A grid: comment lines, a header of column values, a row per row value with its cells empty. */
function grid(what: string, corner: string, rows: readonly number[], columns: readonly number[]): string {
  const blank = ','.repeat(columns.length);
  return [NOTE, `# ${what}`, `${corner},${columns.join(',')}`, ...rows.map((r) => `${r}${blank}`)].join('\n') + '\n';
}

/** A profile: a header of two labels, then "side, value" rows with the value empty. */
function profile(what: string, header: string, rows: readonly number[]): string {
  return [NOTE, `# ${what}`, header, ...rows.map((r) => `${r},`)].join('\n') + '\n';
}

const cm = { depth: 'cm', fieldSide: 'cm' } as const;

function photon(mv: number): { entry: object; files: TemplateFile[] } {
  const id = `${mv}X`;
  const dir = id.toLowerCase();
  const files: TemplateFile[] = [
    {
      path: `${dir}/pdd.csv`,
      content: grid(
        `${id} PDD (%) at the PDD's SSD vs depth (cm, rows) and square field side at the surface (cm)`,
        'depth_cm\\field_cm',
        PHOTON_DEPTHS_CM,
        PHOTON_FIELDS_CM,
      ),
    },
    {
      path: `${dir}/tmr.csv`,
      content: grid(`${id} TMR vs depth (cm, rows) and square field side at depth (cm)`, 'depth_cm\\field_cm', PHOTON_DEPTHS_CM, PHOTON_FIELDS_CM),
    },
    {
      path: `${dir}/sc.csv`,
      content: profile(
        `${id} Sc vs collimator equivalent square at the isocenter plane (cm); 1 for the reference field`,
        'field_cm,sc',
        PHOTON_FIELDS_CM,
      ),
    },
    {
      path: `${dir}/sp.csv`,
      content: profile(`${id} Sp vs equivalent square at the measurement depth (cm); 1 for the reference field`, 'field_cm,sp', PHOTON_FIELDS_CM),
    },
    {
      path: `${dir}/oar.csv`,
      content: grid(
        `${id} off-axis ratio vs depth (cm, rows) and distance from the central axis at depth (cm)`,
        'depth_cm\\offaxis_cm',
        OAR_DEPTHS_CM,
        OFF_AXIS_CM,
      ),
    },
  ];
  const entry = {
    id,
    radiationType: 'PHOTON',
    nominalEnergyMV: mv,
    fff: false,
    calibration: { ssd0Cm: null, d0Cm: null, doseCGyPerMu: null, dmaxCm: null, referenceFieldAt: 'surface', referenceFieldCm: 10 },
    pdd: { file: `${dir}/pdd.csv`, ssdCm: null, normalizationDepthCm: null, units: { ...cm, value: 'percent' } },
    tpr: { file: `${dir}/tmr.csv`, kind: 'TMR', normalizationDepthCm: null, units: cm },
    sc: { file: `${dir}/sc.csv`, units: { fieldSide: 'cm' } },
    sp: { file: `${dir}/sp.csv`, units: { fieldSide: 'cm' } },
    oar: { file: `${dir}/oar.csv`, offAxisAt: 'depth', units: { depth: 'cm', offAxis: 'cm' } },
    mlcTransmission: null,
    dosimetricLeafGapMm: null,
    collimatorExchangeK: null,
  };
  return { entry, files };
}

function electron(mev: number, applicators: TemplateRequest['applicators']): { entry: object; files: TemplateFile[] } {
  const id = `${mev}E`;
  const dir = id.toLowerCase();
  // Depths to beyond the practical range (about E/2 cm, common practice), every 2 mm.
  const depths = Array.from({ length: Math.ceil((mev / 2 + 1) / 0.2) + 1 }, (_, k) => Math.round(k * 2) / 10);
  const widest = Math.max(...applicators.map((a) => a.sideCm));
  const files: TemplateFile[] = [
    {
      path: `${dir}/pdd.csv`,
      content: grid(
        `${id} PDD (%) vs depth (cm, rows) and cutout equivalent square (cm), each column 100 at its own dmax`,
        'depth_cm\\cutout_cm',
        depths,
        CUTOUTS_CM.filter((c) => c <= widest),
      ),
    },
  ];
  const entries = applicators.map((a) => {
    const cutouts = CUTOUTS_CM.filter((c) => c <= a.sideCm);
    const name = a.id.toLowerCase();
    files.push(
      {
        path: `${dir}/se-${name}.csv`,
        content: profile(`${id} output factor Se of applicator ${a.id} vs cutout equivalent square (cm)`, 'cutout_cm,se', cutouts),
      },
      {
        path: `${dir}/ssd-eff-${name}.csv`,
        content: profile(`${id} effective SSD (cm) of applicator ${a.id} vs cutout equivalent square (cm)`, 'cutout_cm,ssd_eff_cm', cutouts),
      },
    );
    return {
      id: a.id,
      sideCm: a.sideCm,
      outputFactor: { file: `${dir}/se-${name}.csv`, units: { fieldSide: 'cm' } },
      effectiveSsdCm: { file: `${dir}/ssd-eff-${name}.csv`, units: { fieldSide: 'cm' } },
    };
  });
  const entry = {
    id,
    radiationType: 'ELECTRON',
    nominalEnergyMeV: mev,
    calibration: { ssd0Cm: null, d0Cm: null, doseCGyPerMu: null, referenceApplicator: applicators[0]?.id ?? null },
    pdd: { file: `${dir}/pdd.csv`, ssdCm: null, units: { ...cm, value: 'percent' } },
    applicators: entries,
  };
  return { entry, files };
}

/** Every file of the new machine's folder, the manifest first. */
export function beamDataTemplate(r: TemplateRequest): TemplateFile[] {
  const photons = r.photonsMV.map(photon);
  const electrons = r.electronsMeV.map((e) => electron(e, r.applicators));
  const manifest = {
    format: 'plumbline.beam-data',
    formatVersion: 1,
    dataVersion: null,
    approval: { commissionedOn: null, approvedOn: null, approvedBy: null },
    machine: {
      name: r.machine,
      aliases: [],
      sadCm: 100,
      limits: { maxFieldSideCm: null, maxJawPositionCm: null, maxLeafPositionCm: null, maxMuPerBeam: null },
      clinicalRange: { fieldSideCm: [null, null], depthCm: [null, null] },
    },
    beams: photons.map((p) => p.entry),
    electronBeams: electrons.map((e) => e.entry),
  };
  return [
    { path: 'manifest.json', content: `${JSON.stringify(manifest, null, 2)}\n` },
    { path: 'README.md', content: readme(r) },
    ...photons.flatMap((p) => p.files),
    ...electrons.flatMap((e) => e.files),
  ];
}

function readme(r: TemplateRequest): string {
  return `# Beam data of ${r.machine} (to fill)

Written by \`plumbline beams new\`. Nothing here is data yet: every \`null\` in \`manifest.json\` and
every empty cell of the CSV tables is the clinic's own commissioned, validated value to enter.

1. \`manifest.json\`: \`dataVersion\` (your name for this data set), \`approval\` (who approved the data for
   clinical use, and when), the machine's \`limits\` and \`clinicalRange\` (the field sides and depths you
   treat), and per beam its calibration (SSD0, d0, the dose per MU at d0 for the reference field, dmax),
   the SSD and normalization depth of each PDD, the TMR normalization depth, the MLC transmission, the
   dosimetric leaf gap and the collimator exchange factor (delete the keys a beam does not use; add
   wedges and trays as docs/beam-data.md shows).
2. One folder per beam: \`pdd.csv\` and \`tmr.csv\` (depth down the rows, field side across), \`sc.csv\` and
   \`sp.csv\` (one factor per field side), \`oar.csv\` (depth down, distance off axis across); per electron
   energy \`pdd.csv\` by cutout, and per applicator its output factor (\`se-*.csv\`) and effective SSD
   (\`ssd-eff-*.csv\`) by cutout. Rows and columns may be added or removed; keep them increasing.
3. Run \`plumbline beams validate manifest.json\` until it reports no error. No check uses beam data
   that fail their validation.

docs/beam-data.md explains every field, its convention and how each quantity is usually measured.

Caution: plumbline is an aid to, never a replacement for, the review of a qualified medical physicist.
Beam data must be the clinic's own, commissioned and validated. Local regulations and licensed practice prevail.
`;
}
