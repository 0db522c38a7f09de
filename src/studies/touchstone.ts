// Touchstone 2.0 text of a stack's S-parameters (Touchstone File Format Specification, version 2.0, IBIS Open
// Forum, 2009): `[Version] 2.0`, the option line `# GHz S RI R <Z1>`, `[Number of Ports]`, for two ports
// `[Two-Port Data Order] 21_12` (each line f S11 S21 S12 S22, the order version 1 files use too),
// `[Number of Frequencies]`, `[Reference]` with each port's impedance (it overrides the option line's), then
// `[Network Data]` … `[End]`. The file is ASCII only (the specification allows nothing else); comments start
// with "!".

import { formatNumber } from '../report/table.ts';
import type { Stack } from '../stack/types.ts';
import { degFromRad, mmFromM } from '../units.ts';
import type { PlaneShift, SParameters } from './sparams.ts';

/** `.s2p`, or `.s1p` for a one-port. */
export const touchstoneExtension = (s: SParameters): string => `.s${s.ports}p`;

/** Printable ASCII only: anything else becomes "?". */
const ascii = (text: string): string => text.replace(/[^\x20-\x7e]/g, '?');

const num = (x: number): string => formatNumber(x);

/** The header comments: what the ports and planes are. */
function comments(stack: Stack, s: SParameters, shift: PlaneShift, version: string): string[] {
  const angle = Number(degFromRad(stack.incidence.angle_rad).toPrecision(10));
  const d_mm = stack.layers.reduce((sum, l) => sum + (l.kind === 'bulk' ? mmFromM(l.thickness_m) : 0), 0);
  const lines = [
    `! slabecho ${version}: ${ascii(stack.title)}`,
    `! plane wave at ${angle} deg from the normal, ${stack.incidence.polarization}; S-parameters of power waves`,
    `! port 1: the front half-space (${ascii(stack.front.name)}), reference plane at x = ${num(-mmFromM(shift.front_m))} mm`,
  ];
  if (s.ports === 2 && stack.back !== 'pec') {
    lines.push(`! port 2: the back half-space (${ascii(stack.back.name)}), reference plane at x = ${num(Number((d_mm + mmFromM(shift.back_m)).toPrecision(12)))} mm`);
  } else lines.push('! one port: a perfect conductor at the back face');
  lines.push(`! the stack spans x = 0 to ${num(Number(d_mm.toPrecision(12)))} mm; reference impedances: each half-space's wave impedance E_t/H_t`);
  return lines;
}

/** The whole file, one data line per frequency, 12 significant digits. */
export function touchstoneText(stack: Stack, s: SParameters, shift: PlaneShift, version: string): string {
  const n = s.f_Hz.length;
  const lines = [
    ...comments(stack, s, shift, version),
    '[Version] 2.0',
    `# GHz S RI R ${num(s.Z_ref_ohm[0])}`,
    `[Number of Ports] ${s.ports}`,
    ...(s.ports === 2 ? ['[Two-Port Data Order] 21_12'] : []),
    `[Number of Frequencies] ${n}`,
    `[Reference] ${s.Z_ref_ohm.map(num).join(' ')}`,
    '[Network Data]',
  ];
  for (let i = 0; i < n; i++) {
    const f = num(s.f_Hz[i] * 1e-9); // as spectrum.csv writes f_GHz
    lines.push(s.ports === 1
      ? `${f} ${num(s.S11_re[i])} ${num(s.S11_im[i])}`
      : `${f} ${num(s.S11_re[i])} ${num(s.S11_im[i])} ${num(s.S21_re[i])} ${num(s.S21_im[i])} ` +
        `${num(s.S12_re[i])} ${num(s.S12_im[i])} ${num(s.S22_re[i])} ${num(s.S22_im[i])}`);
  }
  lines.push('[End]');
  return `${lines.join('\n')}\n`;
}
