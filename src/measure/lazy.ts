// Result lists that are expensive to build (one object per pair or glitch) are made on first read.
// The property is an ordinary enumerable one to every reader: JSON.stringify, structured clone
// (postMessage), spread and property access all see the array; assigning replaces it.

export function lazyField<T extends object>(obj: T, key: keyof T & string, make: () => unknown): void {
  Object.defineProperty(obj, key, {
    enumerable: true,
    configurable: true,
    get() {
      const value = make();
      Object.defineProperty(obj, key, { value, enumerable: true, configurable: true, writable: true });
      return value;
    },
    set(value: unknown) {
      Object.defineProperty(obj, key, { value, enumerable: true, configurable: true, writable: true });
    },
  });
}
