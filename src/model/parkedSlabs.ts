// Full slabs of the builder's change log, parked until finish() reads them once, in order.
//
// The log and the finished arrays would otherwise both be resident when finish() ends, so the
// peak would be their sum. Each full slab is copied into a resizable ArrayBuffer; finish() copies
// it back into a reused scratch array and shrinks the parked buffer to zero, which hands its
// pages back to the system at once instead of at some later garbage collection. The peak is then
// about the finished arrays alone. Writing and reading go through plain typed arrays only: on
// engines of 2023–24 element access through a view of a resizable buffer is several times slower,
// while a bulk copy is not. Where resizable buffers are missing, plain buffers are parked and the
// garbage collector frees them.

type Resizable = ArrayBuffer & { resizable?: boolean; resize?: (n: number) => void };
type ResizableConstructor = new (byteLength: number, options: { maxByteLength: number }) => Resizable;

const resizable = typeof (ArrayBuffer.prototype as Resizable).resize === 'function';
const EMPTY = new ArrayBuffer(0);

function bytesOf(view: ArrayBufferView, byteLength: number): Uint8Array {
  return new Uint8Array(view.buffer, view.byteOffset, byteLength);
}

export class ParkedSlabs {
  private parked: Resizable[] = [];

  get count(): number {
    return this.parked.length;
  }

  /** Keeps a copy of the first `byteLength` bytes of `slab`; the caller may then reuse it. */
  park(slab: ArrayBufferView, byteLength: number): void {
    const buffer: Resizable = resizable ? new (ArrayBuffer as unknown as ResizableConstructor)(byteLength, { maxByteLength: byteLength }) : new ArrayBuffer(byteLength);
    new Uint8Array(buffer).set(bytesOf(slab, byteLength));
    this.parked.push(buffer);
  }

  /** Bytes held by parked slab i. */
  byteLengthOf(i: number): number {
    return this.parked[i].byteLength;
  }

  /** Copies parked slab i to the start of `into`, keeping it parked. Returns its byte length. */
  copyInto(i: number, into: ArrayBufferView): number {
    const buffer = this.parked[i];
    const n = buffer.byteLength;
    bytesOf(into, n).set(new Uint8Array(buffer));
    return n;
  }

  /** Copies parked slab i to the start of `into` and lets its memory go. Returns its byte length. */
  takeInto(i: number, into: ArrayBufferView): number {
    const buffer = this.parked[i];
    const n = this.copyInto(i, into);
    if (buffer.resizable && buffer.resize) buffer.resize(0);
    this.parked[i] = EMPTY;
    return n;
  }

  /** Takes the last parked slab back out (see takeInto) and forgets it. */
  popInto(into: ArrayBufferView): number {
    const n = this.takeInto(this.parked.length - 1, into);
    this.parked.pop();
    return n;
  }

  /** Lets every parked slab go. */
  clear(): void {
    for (const buffer of this.parked) if (buffer.resizable && buffer.resize) buffer.resize(0);
    this.parked = [];
  }
}
