// A big dump for the tests that read one file with one and with several threads: about `mb` MB of
// invented changes (24 lanes, a 12-bit and a 40-bit word, a real, a tap net with zero-width
// pulses and repeated timestamps). Invented data: the tests compare two ways of reading it, never
// its values against an outside truth.
import { closeSync, openSync, writeSync } from 'node:fs';

const HEADER = [
  '$timescale 1ps $end',
  '$scope module rig $end',
  ...Array.from({ length: 24 }, (_, k) => `$var wire 1 ${String.fromCharCode(33 + k)} lane${k} $end`),
  '$var wire 12 ~ word [11:0] $end',
  '$var wire 40 }} wide [39:0] $end',
  '$var real 64 ]] level $end',
  '$var wire 1 {{ tap $end',
  '$upscope $end',
  '$enddefinitions $end',
  '',
].join('\n');

/** About `mb` MB of body after HEADER; the same timestamp is written twice now and then. */
export function writeBigDump(path: string, mb: number, tail = ''): void {
  const fd = openSync(path, 'w');
  writeSync(fd, `${HEADER}#0\n$dumpvars\n${Array.from({ length: 24 }, (_, k) => `0${String.fromCharCode(33 + k)}`).join('\n')}\nb0 ~\nb0 }}\nr0 ]]\n0{{\n$end\n`);
  let t = 0;
  let written = 0;
  let seed = 7;
  const rnd = () => (seed = (seed * 1103515245 + 12345) >>> 0) >>> 8;
  while (written < mb * 1e6) {
    let chunk = '';
    for (let s = 0; s < 2000; s++) {
      t += 1 + (rnd() % 900);
      chunk += `#${t}\n`;
      for (let c = 0; c < 6; c++) chunk += `${rnd() & 1}${String.fromCharCode(33 + (rnd() % 24))}\n`;
      if (s % 3 === 0) chunk += `b${(rnd() & 0xfff).toString(2)} ~\n`;
      if (s % 7 === 0) chunk += `b${rnd().toString(2)}${(rnd() & 0xff).toString(2)} }}\n`;
      if (s % 11 === 0) chunk += `r${(rnd() % 3300) / 1000} ]]\n`;
      if (s % 13 === 0) chunk += `1{{\n0{{\n#${t}\n1{{\n`; // a zero-width pulse, and a repeated timestamp
    }
    written += writeSync(fd, chunk);
  }
  writeSync(fd, tail);
  closeSync(fd);
}

