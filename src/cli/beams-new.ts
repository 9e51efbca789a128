import { existsSync, mkdirSync, readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { z } from 'zod';
import { CAUTION } from '../report/caution.js';
import { beamDataTemplate } from '../run/index.js';
import { writeFileAtomic } from './atomic-write.js';
import type { CommandOutcome } from './outcome.js';
import { refuseOptions } from './refuse.js';

const energies = (what: string) =>
  z
    .string()
    .regex(/^\d+(\.\d+)?(,\d+(\.\d+)?)*$/, `${what} must be energies separated by commas, e.g. 6,10`)
    .transform((s) => s.split(',').map(Number));

/** An applicator as ID (its side read from the digits, A10 → 10 cm) or ID=side in cm. */
const Applicator = z
  .string()
  .regex(/^[A-Za-z0-9_-]+(=\d+(\.\d+)?)?$/, 'an applicator is an ID (A10) or ID=side in cm (CONE6=6)')
  .transform((s, ctx) => {
    const [id, side] = s.split('=');
    const sideCm = Number(side ?? /(\d+(\.\d+)?)/.exec(id!)?.[1]);
    if (!(sideCm > 0)) ctx.addIssue({ code: 'custom', message: `the side of applicator ${id} cannot be read from its ID: write ${id}=side in cm` });
    return { id: id!, sideCm };
  });

export const BeamsNewOptions = z.object({
  machine: z.string().regex(/^[^\s\\/]{1,64}$/, '--machine must be the Treatment Machine Name, without spaces or slashes'),
  photons: energies('--photons').default([]),
  electrons: energies('--electrons').default([]),
  applicators: z
    .string()
    .transform((s) => s.split(','))
    .pipe(z.array(Applicator))
    .default([]),
  out: z.string().min(1).optional(),
});

/** `plumbline beams new`: a new machine's manifest and CSV templates, to fill and validate. */
export function runBeamsNew(raw: Record<string, unknown>): CommandOutcome {
  const p = BeamsNewOptions.safeParse(raw);
  if (!p.success) return refuseOptions(p.error.issues.map((i) => i.message));
  const o = p.data;
  if (!o.photons.length && !o.electrons.length) return refuseOptions(['give at least one energy: --photons 6,10 and/or --electrons 6,9']);
  if (o.electrons.length && !o.applicators.length) return refuseOptions(['electron beams need their applicators: --applicators A10,A15']);
  const out = o.out ?? `${o.machine}-beam-data`;
  if (existsSync(out) && readdirSync(out).length) return refuseOptions([`${out} already holds files: give a new or empty folder with --out`]);
  const files = beamDataTemplate({ machine: o.machine, photonsMV: o.photons, electronsMeV: o.electrons, applicators: o.applicators });
  for (const f of files) {
    const path = join(out, f.path);
    mkdirSync(dirname(path), { recursive: true });
    writeFileAtomic(path, f.content);
  }
  return {
    stdout: [
      `wrote ${files.length} files in ${out}: a manifest and CSV tables whose values are left for the clinic's own data`,
      `next: fill them (${join(out, 'README.md')} says what goes where), then run \`plumbline beams validate ${join(out, 'manifest.json')}\``,
      CAUTION,
    ],
    stderr: [],
    exitCode: 0,
  };
}
