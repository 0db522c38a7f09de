// slabecho check FILE…: validate stack files; one line per problem, naming the field.

import type { Command } from '../command.ts';
import { readArgs } from '../command.ts';
import { loadStackFile } from '../io.ts';
import { CliError } from '../command.ts';
import { fmtGHz } from '../../stack/warnings.ts';

export const check: Command = {
  name: 'check',
  summary: 'validate stack files (exit 2 with one line per problem)',
  usage: `Usage: slabecho check FILE... [--expanded]

Validate one or more stack files (*.stack.json). Every problem is listed on its own line,
prefixed by the file and naming the field, e.g.
  wall.stack.json: layers[1].thickness_mm: must be a number > 0 (got 0)
Warnings (such as a band leaving a material's validity range) go to stderr and do not fail.

Options:
  --expanded   print each valid file as JSON with every default filled in
  -h, --help   show this help

Exit: 0 all files valid, 2 any problem.`,
  async run(args, io) {
    const a = readArgs(check, args, io, { expanded: { type: 'boolean' } }, [1, Infinity]);
    if (a === null) return 0;
    let bad = 0;
    for (const path of a.positionals) {
      let r;
      try {
        r = loadStackFile(path);
      } catch (e) {
        if (!(e instanceof CliError)) throw e;
        io.err(e.message);
        bad++;
        continue;
      }
      if (!r.ok) {
        for (const line of r.errors) io.err(`${path}: ${line}`);
        io.err(`${path}: ${r.errors.length} problem${r.errors.length === 1 ? '' : 's'}; not a valid stack`);
        bad++;
        continue;
      }
      for (const w of r.warnings) io.err(`${path}: warning: ${w}`);
      const f = r.file;
      if (a.values.expanded) io.out(JSON.stringify(f, null, 2));
      else {
        const inc = f.incidence.angle_deg === 0 ? `normal incidence (${f.incidence.polarization})` : `${f.incidence.angle_deg}° ${f.incidence.polarization}`;
        io.out(`${path}: ok: "${f.title}", ${f.layers.length} layer${f.layers.length === 1 ? '' : 's'}, ` +
          `${fmtGHz(f.band_GHz[0])}–${fmtGHz(f.band_GHz[1])} GHz, ${f.points} points, ${inc}, back ${f.back}`);
      }
    }
    return bad > 0 ? 2 : 0;
  },
};
