// What first use of fresh memory costs on this machine: a new ArrayBuffer the size of a dump's
// finished arrays, one byte written per 4 KiB page, in a fresh process. Any parser that builds
// those arrays pays at least this on top of reading the bytes, so floor ÷ (floor + touch) bounds
// the ratio any such parser can reach here. On virtual machines whose memory the host backs only
// when first touched, this is several times what it is on bare hardware.

export interface TouchResult {
  bytes: number;
  ms: number;
}

export function runTouch(bytes: number): TouchResult {
  const t0 = performance.now();
  const a = new Uint8Array(bytes);
  for (let i = 0; i < bytes; i += 4096) a[i] = 1;
  const ms = performance.now() - t0;
  if (a[0] !== 1 && bytes > 0) throw new Error('unreachable: the write did not land');
  return { bytes, ms };
}
