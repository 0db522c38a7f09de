// A small Touchstone 2.0 reader for the tests, written from the file format's rules (Touchstone File Format
// Specification 2.0, IBIS Open Forum, 2009): "!" starts a comment; [Version] first; the option line
// "# <unit> S <RI|MA|DB> R <ohms>"; [Number of Ports]; for two ports [Two-Port Data Order] 12_21 (data N11 N12 N21
// N22) or 21_12 (N11 N21 N12 N22); [Number of Frequencies]; [Reference] overriding the option line's impedance;
// [Network Data] … [End]. Keywords are case-insensitive.

import type { Complex } from '../../src/complex.ts';

export interface TouchstoneData {
  version: string;
  ports: number;
  /** Reference impedance per port, ohms. */
  reference: number[];
  f_Hz: number[];
  /** S[i][j][k]: S_(i+1)(j+1) at frequency k. */
  S: Complex[][][];
  comments: string[];
}

const UNITS: Record<string, number> = { hz: 1, khz: 1e3, mhz: 1e6, ghz: 1e9 };

export function readTouchstone(text: string): TouchstoneData {
  if (/[^\x09\x0a\x0d\x20-\x7e]/.test(text)) throw new Error('not ASCII');
  const comments: string[] = [];
  const tokens: string[] = [];
  let version = '', ports = 0, nFreq = -1, order = '', unit = 1, format = 'MA', optionRef = 50;
  let reference: number[] | null = null, inData = false, ended = false;
  for (const raw of text.split(/\r?\n/)) {
    const bang = raw.indexOf('!');
    if (bang >= 0) comments.push(raw.slice(bang + 1).trim());
    const line = (bang >= 0 ? raw.slice(0, bang) : raw).trim();
    if (line === '') continue;
    if (ended) throw new Error(`content after [End]: ${line}`);
    const kw = /^\[([^\]]+)\]\s*(.*)$/.exec(line);
    if (kw) {
      const key = kw[1].toLowerCase(), arg = kw[2].trim();
      if (!version && key !== 'version') throw new Error('[Version] must come first');
      if (key === 'version') version = arg;
      else if (key === 'number of ports') ports = Number(arg);
      else if (key === 'two-port data order') order = arg;
      else if (key === 'number of frequencies') nFreq = Number(arg);
      else if (key === 'reference') reference = arg.split(/\s+/).map(Number);
      else if (key === 'network data') inData = true;
      else if (key === 'end') { inData = false; ended = true; }
      else throw new Error(`unexpected keyword [${kw[1]}]`);
      continue;
    }
    if (line.startsWith('#')) {
      const opts = line.slice(1).trim().toLowerCase().split(/\s+/);
      for (let i = 0; i < opts.length; i++) {
        if (opts[i] in UNITS) unit = UNITS[opts[i]];
        else if (['ri', 'ma', 'db'].includes(opts[i])) format = opts[i].toUpperCase();
        else if (opts[i] === 'r') optionRef = Number(opts[++i]);
        else if (opts[i] !== 's') throw new Error(`unexpected option ${opts[i]}`);
      }
      continue;
    }
    if (!inData) throw new Error(`data outside [Network Data]: ${line}`);
    tokens.push(...line.split(/\s+/));
  }
  if (!ended) throw new Error('no [End]');
  if (ports === 2 && order !== '12_21' && order !== '21_12') throw new Error('a two-port file needs [Two-Port Data Order]');
  const perFreq = 1 + 2 * ports * ports;
  if (tokens.length % perFreq !== 0) throw new Error('incomplete data');
  const f_Hz: number[] = [];
  const S: Complex[][][] = Array.from({ length: ports }, () => Array.from({ length: ports }, () => [] as Complex[]));
  const pair = (a: number, b: number): Complex => {
    if (format === 'RI') return { re: a, im: b };
    const mag = format === 'DB' ? 10 ** (a / 20) : a, ph = (b * Math.PI) / 180;
    return { re: mag * Math.cos(ph), im: mag * Math.sin(ph) };
  };
  for (let k = 0; k * perFreq < tokens.length; k++) {
    const v = tokens.slice(k * perFreq, (k + 1) * perFreq).map(Number);
    if (v.some((x) => !Number.isFinite(x))) throw new Error(`not a number in data set ${k}`);
    f_Hz.push(v[0] * unit);
    const cells: Complex[] = [];
    for (let j = 1; j < perFreq; j += 2) cells.push(pair(v[j], v[j + 1]));
    if (ports === 1) S[0][0].push(cells[0]);
    else if (ports === 2) {
      const [a, b, c, d] = cells; // 21_12: S11 S21 S12 S22; 12_21: S11 S12 S21 S22
      S[0][0].push(a); S[1][1].push(d);
      if (order === '21_12') { S[1][0].push(b); S[0][1].push(c); } else { S[0][1].push(b); S[1][0].push(c); }
    } else throw new Error('only one- and two-port files here');
  }
  if (nFreq !== f_Hz.length) throw new Error(`[Number of Frequencies] ${nFreq}, data for ${f_Hz.length}`);
  return { version, ports, reference: reference ?? Array(ports).fill(optionRef), f_Hz, S, comments };
}
