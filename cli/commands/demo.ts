/**
 * `forecatch demo DIR`: writes the bundled demo study (invented rail-lab data) to DIR.
 */
import type { CliCommand } from '../command';
import { parseFlags } from '../command';
import { demoStudy, DEMO_README } from '../../shared/simulate/demoStudy';
import { writeSimulatedStudy } from '../io/writeSimulatedStudy';

const HELP = `usage: forecatch demo DIR

Writes the demo study to DIR: three invented catchers on Forecatch's motorised rail lab (ball pushed down at
0, 0.5 and 1 g effective), 24 trials each, C3D markers at 200 Hz and EDF+ forearm EMG at 2 kHz, the study
file study.forecatch.json, the trial list trials.csv and a README.txt. All data are invented and generated
deterministically by Forecatch's simulator (the same files as assets/demo/).
Then: forecatch analyze DIR --out DIR/results`;

export const command: CliCommand = {
  name: 'demo',
  summary: 'write the demo study (invented rail-lab data) to a folder',
  help: HELP,
  async run(args) {
    const { positionals } = parseFlags(args);
    if (positionals.length !== 1) {
      process.stderr.write(`forecatch demo: give the output folder\n${HELP}\n`);
      return 2;
    }
    const { trials, settings } = demoStudy();
    const path = await writeSimulatedStudy(positionals[0], trials, settings, 'Forecatch demo: rail lab (invented data)', DEMO_README);
    process.stdout.write(`wrote the demo study (${trials.length} trials, invented data): ${path}\n`);
    return 0;
  },
};
