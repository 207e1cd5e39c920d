// The page's side of the measuring worker. The dump goes over once per load: on a cross-origin
// isolated page its SharedArrayBuffers are shared, not copied; elsewhere structured clone copies it.
// Every call waits for the dump to be there; answers for a dump that has since been replaced are
// dropped by the caller (see `generation`).

import * as Comlink from 'comlink';
import type { Dump } from '../../model/dump';
import type { MeasurementSpec } from '../../plan/types';
import type { MeasureApi } from '../../../workers/measure.worker';
import type { RowFilter, SortKey } from './order';
import type { GlitchView, RunResult } from './types';
import type { WorstRow } from './worstrows';

export class MeasureClient {
  private readonly api: Comlink.Remote<MeasureApi>;
  private ready: Promise<unknown> = Promise.resolve();
  /** Bumped with each dump, so late answers about an old dump can be told apart. */
  generation = 0;
  /** Whether the worker reads the page's own copy of the dump (SharedArrayBuffer). */
  shared = false;

  constructor() {
    const worker = new Worker(new URL('../../../workers/measure.worker.ts', import.meta.url), { type: 'module', name: 'midrail-measure' });
    this.api = Comlink.wrap<MeasureApi>(worker);
  }

  setDump(dump: Dump): Promise<{ shared: boolean }> {
    this.generation++;
    const p = this.api.setDump(dump);
    this.ready = p.catch(() => undefined);
    return p.then((r) => {
      this.shared = r.shared;
      return r;
    });
  }

  async run(spec: MeasurementSpec, levels?: Record<string, string>): Promise<RunResult> {
    await this.ready;
    return this.api.run(spec, levels);
  }

  async scan(width: string | null, level?: string): Promise<{ ok: true; view: GlitchView } | { ok: false; error: string }> {
    await this.ready;
    return this.api.scan(width, level);
  }

  async order(id: string, key: SortKey, descending: boolean, filter: RowFilter): Promise<Uint32Array | null> {
    await this.ready;
    return this.api.order(id, key, descending, filter);
  }

  async book(rows: WorstRow[], format: 'xlsx' | 'csv', source: Blob | string | null, toolVersion: string): Promise<Uint8Array | string> {
    await this.ready;
    return this.api.book(rows, format, source, toolVersion);
  }
}
