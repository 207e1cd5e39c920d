// Command-line options of the benchmark (`npm run bench -- --quick --only parse`).

export const SECTION_NAMES = ['parse', 'measure', 'check', 'browser'] as const;
export type SectionName = (typeof SECTION_NAMES)[number];

export interface BenchOptions {
  quick: boolean;
  only: Set<SectionName>;
  /** Dump sizes in MB (10^6 bytes) and net counts for the parse section. */
  sizes: number[];
  nets: number[];
  /** Runs per dump below 200 MB; the best is kept (least disturbed by other load). */
  reps: number;
  /** Time allowed to the vcd-parser baseline. */
  capSeconds: number;
  profile: boolean;
  clean: boolean;
}

export const USAGE = `usage: npm run bench -- [--quick] [--only parse|measure|check|browser[,...]]
                        [--sizes 10,100,500] [--nets 100,10000] [--reps N] [--cap-seconds S]
                        [--profile] [--clean]
  --quick        smaller dumps (10 and 50 MB) and fewer repeats
  --only         run only these sections (comma-separated)
  --profile      CPU-profile one parse (node --cpu-prof) and list the hottest functions
  --clean        delete the cached synthetic dumps first (${'os.tmpdir()'}/midrail-bench)
`;

function list(text: string | undefined, flag: string): number[] {
  const items = (text ?? '').split(',').map((s) => Number(s.trim()));
  if (items.length === 0 || items.some((n) => !(n > 0))) throw new Error(`${flag} needs a comma-separated list of positive numbers`);
  return items;
}

export function parseOptions(argv: string[]): BenchOptions | null {
  const quick = argv.includes('--quick');
  const opts: BenchOptions = {
    quick,
    only: new Set(SECTION_NAMES),
    sizes: quick ? [10, 50] : [10, 100, 500],
    nets: [100, 10000],
    reps: quick ? 2 : 3,
    capSeconds: quick ? 5 : 10,
    profile: false,
    clean: false,
  };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const value = () => {
      const v = argv[++i];
      if (v === undefined) throw new Error(`${a} needs a value`);
      return v;
    };
    if (a === '--quick') continue;
    else if (a === '--help' || a === '-h') return null;
    else if (a === '--only') {
      const names = value().split(',').map((s) => s.trim());
      for (const n of names) {
        if (!(SECTION_NAMES as readonly string[]).includes(n)) throw new Error(`--only: unknown section '${n}' (choose from ${SECTION_NAMES.join(', ')})`);
      }
      opts.only = new Set(names as SectionName[]);
    } else if (a === '--sizes') opts.sizes = list(value(), a);
    else if (a === '--nets') opts.nets = list(value(), a);
    else if (a === '--reps') opts.reps = list(value(), a)[0];
    else if (a === '--cap-seconds') opts.capSeconds = list(value(), a)[0];
    else if (a === '--profile') opts.profile = true;
    else if (a === '--clean') opts.clean = true;
    else throw new Error(`unknown option '${a}'\n${USAGE}`);
  }
  return opts;
}
