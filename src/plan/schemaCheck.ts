// Checks a JSON value against the subset of JSON Schema (draft 2020-12) that the plan schema uses,
// so the schema shipped for editors is also the one the CLI and viewer enforce. Every problem is
// reported with the JSON path of the value at fault (`$.measurements[2].max`), not only the first.
//
// Keywords understood: type, const, enum, pattern, minLength, minimum, minItems, properties,
// required, additionalProperties, items, $ref (local #/$defs/...), oneOf, if/then/else.
// A oneOf whose branches each fix `kind` with const is treated as a tagged union: the branch is
// chosen by the value's kind, so errors speak about that kind's fields only.

export interface SchemaNode {
  type?: string | string[];
  const?: unknown;
  enum?: unknown[];
  pattern?: string;
  minLength?: number;
  minimum?: number;
  minItems?: number;
  properties?: Record<string, SchemaNode>;
  required?: string[];
  additionalProperties?: boolean | SchemaNode;
  items?: SchemaNode;
  $ref?: string;
  $defs?: Record<string, SchemaNode>;
  oneOf?: SchemaNode[];
  if?: SchemaNode;
  then?: SchemaNode;
  else?: SchemaNode;
  description?: string;
}

export interface PathIssue {
  /** JSON path of the value at fault, `$` for the document. */
  path: string;
  message: string;
}

const IDENT = /^[A-Za-z_$][A-Za-z0-9_$]*$/;

/** `$.a.b`, `$.a[3]`, `$.levels["top.v_out"]`. */
export function childPath(path: string, key: string | number): string {
  if (typeof key === 'number') return `${path}[${key}]`;
  return IDENT.test(key) ? `${path}.${key}` : `${path}[${JSON.stringify(key)}]`;
}

function typeOf(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'array';
  if (typeof v === 'number') return Number.isInteger(v) ? 'integer' : 'number';
  return typeof v;
}

function matchesType(v: unknown, t: string): boolean {
  const actual = typeOf(v);
  if (t === 'number') return actual === 'number' || actual === 'integer';
  return actual === t;
}

function shown(v: unknown): string {
  const s = JSON.stringify(v);
  return s === undefined ? String(v) : s.length > 60 ? `${s.slice(0, 57)}...` : s;
}

/** Closest known name, for "did you mean" hints on misspelt fields. */
function nearest(word: string, names: string[]): string | null {
  let best: string | null = null;
  let bestCost = Math.max(2, Math.floor(word.length / 3)) + 1;
  for (const n of names) {
    const cost = editDistance(word.toLowerCase(), n.toLowerCase());
    if (cost < bestCost) {
      bestCost = cost;
      best = n;
    }
  }
  return best;
}

function editDistance(a: string, b: string): number {
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const cur = [i];
    for (let j = 1; j <= b.length; j++) {
      cur[j] = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
    }
    prev = cur;
  }
  return prev[b.length];
}

export class SchemaChecker {
  constructor(private readonly root: SchemaNode) {}

  check(value: unknown): PathIssue[] {
    const out: PathIssue[] = [];
    this.visit(this.root, value, '$', out);
    return out;
  }

  private resolve(node: SchemaNode): SchemaNode {
    let n = node;
    // A $ref with sibling keywords (description) still means the referenced schema.
    for (let hops = 0; n.$ref !== undefined && hops < 32; hops++) {
      const m = /^#\/\$defs\/(.+)$/.exec(n.$ref);
      const target = m ? this.root.$defs?.[m[1]] : undefined;
      if (!target) throw new Error(`plan schema: unresolved $ref ${n.$ref}`);
      n = target;
    }
    return n;
  }

  /** Expected-value wording for messages: the schema's own description when it has one. */
  private expected(node: SchemaNode): string {
    const n = this.resolve(node);
    if (n.description) return n.description;
    if (n.enum) return `one of ${n.enum.map((e) => shown(e)).join(', ')}`;
    if (n.const !== undefined) return shown(n.const);
    if (n.type) return `a value of type ${Array.isArray(n.type) ? n.type.join(' or ') : n.type}`;
    return 'a valid value';
  }

  private visit(node: SchemaNode, value: unknown, path: string, out: PathIssue[]): void {
    const n = this.resolve(node);
    if (n.type !== undefined) {
      const types = Array.isArray(n.type) ? n.type : [n.type];
      if (!types.some((t) => matchesType(value, t))) {
        out.push({ path, message: `expected ${this.expected(node)}; got ${typeOf(value)} ${shown(value)}` });
        return;
      }
    }
    if (n.const !== undefined && value !== n.const) {
      out.push({ path, message: `expected ${shown(n.const)}; got ${shown(value)}` });
      return;
    }
    if (n.enum !== undefined && !n.enum.includes(value)) {
      out.push({ path, message: `expected one of ${n.enum.map((e) => shown(e)).join(', ')}; got ${shown(value)}` });
      return;
    }
    if (typeof value === 'string') {
      if (n.minLength !== undefined && value.length < n.minLength) out.push({ path, message: `expected ${this.expected(node)}; got an empty string` });
      else if (n.pattern !== undefined && !new RegExp(n.pattern, 'u').test(value)) {
        out.push({ path, message: `expected ${this.expected(node)}; got ${shown(value)}` });
      }
    }
    if (typeof value === 'number' && n.minimum !== undefined && value < n.minimum) {
      out.push({ path, message: `expected ${this.expected(node)}, at least ${n.minimum}; got ${value}` });
    }
    if (Array.isArray(value)) {
      if (n.minItems !== undefined && value.length < n.minItems) {
        out.push({ path, message: `expected at least ${n.minItems} item${n.minItems === 1 ? '' : 's'}; got ${value.length}` });
      }
      if (n.items) value.forEach((item, i) => this.visit(n.items!, item, childPath(path, i), out));
    }
    if (typeOf(value) === 'object') this.visitObject(n, value as Record<string, unknown>, path, out);
    if (n.oneOf) this.visitOneOf(n.oneOf, value, path, out);
    if (n.if) {
      const probe: PathIssue[] = [];
      this.visit(n.if, value, path, probe);
      const branch = probe.length === 0 ? n.then : n.else;
      if (branch) this.visit(branch, value, path, out);
    }
  }

  private visitObject(n: SchemaNode, obj: Record<string, unknown>, path: string, out: PathIssue[]): void {
    for (const key of n.required ?? []) {
      if (!(key in obj)) {
        const what = n.properties?.[key] ? this.expected(n.properties[key]) : 'a value';
        out.push({ path, message: `missing required field '${key}' (${what})` });
      }
    }
    const known = Object.keys(n.properties ?? {});
    for (const [key, v] of Object.entries(obj)) {
      const p = childPath(path, key);
      const prop = n.properties?.[key];
      if (prop) this.visit(prop, v, p, out);
      else if (n.additionalProperties === false) {
        const hint = nearest(key, known);
        out.push({ path: p, message: `unknown field '${key}'${hint ? ` (did you mean '${hint}'?)` : ''}; allowed here: ${known.join(', ')}` });
      } else if (typeof n.additionalProperties === 'object') this.visit(n.additionalProperties, v, p, out);
    }
  }

  private visitOneOf(branches: SchemaNode[], value: unknown, path: string, out: PathIssue[]): void {
    const resolved = branches.map((b) => this.resolve(b));
    const tags = resolved.map((b) => b.properties?.kind?.const);
    if (tags.every((t) => typeof t === 'string')) {
      if (typeOf(value) !== 'object') {
        out.push({ path, message: `expected an object with a 'kind' of ${tags.join(', ')}; got ${typeOf(value)} ${shown(value)}` });
        return;
      }
      const kind = (value as Record<string, unknown>).kind;
      const at = (tags as unknown[]).indexOf(kind);
      if (kind === undefined) out.push({ path, message: `missing required field 'kind' (one of ${tags.join(', ')})` });
      else if (at < 0) {
        const hint = typeof kind === 'string' ? nearest(kind, tags as string[]) : null;
        out.push({ path: childPath(path, 'kind'), message: `unknown measurement kind ${shown(kind)}${hint ? ` (did you mean '${hint}'?)` : ''}; expected one of ${tags.join(', ')}` });
      } else this.visit(branches[at], value, path, out);
      return;
    }
    const results = branches.map((b) => {
      const probe: PathIssue[] = [];
      this.visit(b, value, path, probe);
      return probe;
    });
    const passing = results.filter((r) => r.length === 0).length;
    if (passing === 1) return;
    if (passing > 1) out.push({ path, message: 'matches more than one allowed form' });
    else out.push(...results.reduce((a, b) => (b.length < a.length ? b : a)));
  }
}
