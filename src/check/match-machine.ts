import type { MachineModel, Plan, Result } from '../model/index.js';

/**
 * The beam data for a plan's Treatment Machine Name: the machine's name or one of its aliases,
 * after the user's `--machine-alias PLANNAME=DATANAME`. Never another machine's data.
 */
export function matchMachine(planMachineName: string | undefined, machine: MachineModel, aliases: ReadonlyMap<string, string>): Result<string> {
  if (!planMachineName) {
    return {
      ok: false,
      issues: [
        {
          severity: 'error',
          code: 'missing-attribute',
          message: 'the beam has no Treatment Machine Name, so its beam data cannot be chosen',
          expected: machine.aliases.join(', '),
        },
      ],
    };
  }
  const mapped = aliases.get(planMachineName);
  const name = mapped ?? planMachineName;
  if (machine.aliases.includes(name)) {
    return {
      ok: true,
      value: mapped ? `--machine-alias ${planMachineName}=${mapped}` : name === machine.name ? 'same name' : `alias ${name} in the beam data`,
    };
  }
  return {
    ok: false,
    issues: [
      {
        severity: 'error',
        code: 'missing-table',
        message:
          `no beam data for machine "${planMachineName}"${mapped ? ` (mapped to "${mapped}")` : ''}; ` +
          // Advice both front doors can follow: the service has no command line, only the beam data's aliases.
          `if it is the machine of beam data ${machine.name}, add "${planMachineName}" to the aliases in its manifest ` +
          `(for one check on the command line: --machine-alias ${planMachineName}=${machine.name})`,
        expected: machine.aliases.join(', '),
        found: name,
      },
    ],
  };
}

/**
 * Of several machines' beam data, the one the plan's Treatment Machine Name names (the first beam
 * that gives one), by the same rule as `matchMachine`; else the first, whose mismatch the check of
 * each beam then reports. The one place a plan's machine is chosen.
 */
export function chooseMachine<T>(
  plan: Plan,
  candidates: readonly [T, ...T[]],
  modelOf: (c: T) => MachineModel,
  aliases: ReadonlyMap<string, string>,
): T {
  const name = plan.beams.find((b) => b.machineName)?.machineName;
  return candidates.find((c) => matchMachine(name, modelOf(c), aliases).ok) ?? candidates[0];
}
