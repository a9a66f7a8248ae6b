/**
 * A small reduced ordered binary decision diagram package: a unique table (so equal functions
 * are equal node ids), ITE with a computed table, existential quantification, the relational
 * product (∃V. f ∧ g in one pass), order-preserving renaming and cofactors.
 *
 * Nodes live in typed arrays; node 0 is the constant 0 and node 1 the constant 1. A variable's
 * level is its position in the order (0 = top). No complement edges and no garbage collection:
 * one manager serves one analysis and is dropped afterwards.
 */

export type BddNode = number;

/** Raised when the node or time budget runs out; callers report the analysis as skipped. */
export class BddLimitError extends Error {}

const NODE_KEY_BITS = 4194304; // 2^22: node ids and levels must fit the unique-table key

export class Bdd {
    static readonly FALSE: BddNode = 0;
    static readonly TRUE: BddNode = 1;

    readonly varCount: number;
    private levels: Int32Array;
    private lows: Int32Array;
    private highs: Int32Array;
    private count = 2;
    private readonly unique = new Map<number, number>();
    private readonly cacheBits: number;
    private readonly cache: Int32Array;
    private readonly maxNodes: number;
    private readonly deadline: number;
    private ticks = 0;

    constructor(varCount: number, options: { maxNodes?: number; deadline?: number } = {}) {
        if (varCount >= 511) throw new BddLimitError('bdd: too many variables');
        this.varCount = varCount;
        // A small machine needs a small computed table; clearing a large one would dominate.
        this.cacheBits = varCount <= 24 ? 12 : 18;
        this.cache = new Int32Array((1 << this.cacheBits) * 4).fill(-1);
        const initial = 1 << 12;
        this.levels = new Int32Array(initial);
        this.lows = new Int32Array(initial);
        this.highs = new Int32Array(initial);
        this.levels[0] = varCount;
        this.levels[1] = varCount;
        this.maxNodes = Math.min(options.maxNodes ?? 2_000_000, NODE_KEY_BITS - 1);
        this.deadline = options.deadline ?? Infinity;
    }

    get size(): number { return this.count; }

    level(f: BddNode): number { return this.levels[f]!; }
    low(f: BddNode): BddNode { return this.lows[f]!; }
    high(f: BddNode): BddNode { return this.highs[f]!; }

    /** The node (level ? hi : lo), reduced and shared. */
    mk(level: number, lo: BddNode, hi: BddNode): BddNode {
        if (lo === hi) return lo;
        const key = (level * NODE_KEY_BITS + lo) * NODE_KEY_BITS + hi;
        const found = this.unique.get(key);
        if (found !== undefined) return found;
        if (this.count >= this.maxNodes) throw new BddLimitError(`bdd: more than ${this.maxNodes} nodes`);
        if ((++this.ticks & 0xfff) === 0 && Date.now() > this.deadline) throw new BddLimitError('bdd: time budget exhausted');
        if (this.count >= this.levels.length) this.grow();
        const id = this.count++;
        this.levels[id] = level;
        this.lows[id] = lo;
        this.highs[id] = hi;
        this.unique.set(key, id);
        return id;
    }

    private grow(): void {
        const n = this.levels.length * 2;
        const grow = (a: Int32Array) => { const b = new Int32Array(n); b.set(a); return b; };
        this.levels = grow(this.levels);
        this.lows = grow(this.lows);
        this.highs = grow(this.highs);
    }

    variable(level: number): BddNode { return this.mk(level, Bdd.FALSE, Bdd.TRUE); }
    literal(level: number, positive: boolean): BddNode {
        return positive ? this.mk(level, Bdd.FALSE, Bdd.TRUE) : this.mk(level, Bdd.TRUE, Bdd.FALSE);
    }

    /** if f then g else h. */
    ite(f: BddNode, g: BddNode, h: BddNode): BddNode {
        if (f === Bdd.TRUE) return g;
        if (f === Bdd.FALSE) return h;
        if (g === h) return g;
        if (g === Bdd.TRUE && h === Bdd.FALSE) return f;
        const slot = ((Math.imul(f, 0x9e3779b1) ^ Math.imul(g, 0x85ebca77) ^ Math.imul(h, 0xc2b2ae3d)) >>> (32 - this.cacheBits)) * 4;
        const c = this.cache;
        if (c[slot] === f && c[slot + 1] === g && c[slot + 2] === h) return c[slot + 3]!;
        const lf = this.levels[f]!, lg = this.levels[g]!, lh = this.levels[h]!;
        const top = Math.min(lf, lg, lh);
        const f0 = lf === top ? this.lows[f]! : f, f1 = lf === top ? this.highs[f]! : f;
        const g0 = lg === top ? this.lows[g]! : g, g1 = lg === top ? this.highs[g]! : g;
        const h0 = lh === top ? this.lows[h]! : h, h1 = lh === top ? this.highs[h]! : h;
        const r = this.mk(top, this.ite(f0, g0, h0), this.ite(f1, g1, h1));
        c[slot] = f; c[slot + 1] = g; c[slot + 2] = h; c[slot + 3] = r;
        return r;
    }

    not(f: BddNode): BddNode { return this.ite(f, Bdd.FALSE, Bdd.TRUE); }
    and(f: BddNode, g: BddNode): BddNode { return this.ite(f, g, Bdd.FALSE); }
    or(f: BddNode, g: BddNode): BddNode { return this.ite(f, Bdd.TRUE, g); }
    xor(f: BddNode, g: BddNode): BddNode { return this.ite(f, this.not(g), g); }
    xnor(f: BddNode, g: BddNode): BddNode { return this.ite(f, g, this.not(g)); }

    /** ∃ the variables whose level is marked in `quantified`. */
    exists(f: BddNode, quantified: Uint8Array, memo: Map<number, number> = new Map()): BddNode {
        const rec = (n: BddNode): BddNode => {
            if (n <= 1) return n;
            const hit = memo.get(n);
            if (hit !== undefined) return hit;
            const l = this.levels[n]!;
            const lo = rec(this.lows[n]!);
            let r: BddNode;
            if (quantified[l]) r = lo === Bdd.TRUE ? Bdd.TRUE : this.or(lo, rec(this.highs[n]!));
            else r = this.mk(l, lo, rec(this.highs[n]!));
            memo.set(n, r);
            return r;
        };
        return rec(f);
    }

    /** The relational product ∃V. f ∧ g, computed without building f ∧ g. */
    andExists(f: BddNode, g: BddNode, quantified: Uint8Array): BddNode {
        const memo = new Map<number, number>();
        const existsMemo = new Map<number, number>();
        const rec = (a: BddNode, b: BddNode): BddNode => {
            if (a === Bdd.FALSE || b === Bdd.FALSE) return Bdd.FALSE;
            if (a === Bdd.TRUE && b === Bdd.TRUE) return Bdd.TRUE;
            if (a === Bdd.TRUE || a === b) return this.exists(b, quantified, existsMemo);
            if (b === Bdd.TRUE) return this.exists(a, quantified, existsMemo);
            if (a > b) { const t = a; a = b; b = t; }
            const key = a * NODE_KEY_BITS + b;
            const hit = memo.get(key);
            if (hit !== undefined) return hit;
            const la = this.levels[a]!, lb = this.levels[b]!;
            const top = Math.min(la, lb);
            const a0 = la === top ? this.lows[a]! : a, a1 = la === top ? this.highs[a]! : a;
            const b0 = lb === top ? this.lows[b]! : b, b1 = lb === top ? this.highs[b]! : b;
            let r: BddNode;
            if (quantified[top]) {
                const r0 = rec(a0, b0);
                r = r0 === Bdd.TRUE ? Bdd.TRUE : this.or(r0, rec(a1, b1));
            } else {
                r = this.mk(top, rec(a0, b0), rec(a1, b1));
            }
            memo.set(key, r);
            return r;
        };
        return rec(f, g);
    }

    /** Renames variables by `to[level]`; the map must preserve the order of the levels f uses. */
    rename(f: BddNode, to: Int32Array): BddNode {
        const memo = new Map<number, number>();
        const rec = (n: BddNode): BddNode => {
            if (n <= 1) return n;
            const hit = memo.get(n);
            if (hit !== undefined) return hit;
            const r = this.mk(to[this.levels[n]!]!, rec(this.lows[n]!), rec(this.highs[n]!));
            memo.set(n, r);
            return r;
        };
        return rec(f);
    }

    /** Cofactor by a partial assignment: `values[level]` is 0, 1, or -1 (left free). */
    restrict(f: BddNode, values: Int8Array): BddNode {
        const memo = new Map<number, number>();
        const rec = (n: BddNode): BddNode => {
            if (n <= 1) return n;
            const hit = memo.get(n);
            if (hit !== undefined) return hit;
            const l = this.levels[n]!;
            const v = values[l]!;
            const r = v === 0 ? rec(this.lows[n]!) : v === 1 ? rec(this.highs[n]!) : this.mk(l, rec(this.lows[n]!), rec(this.highs[n]!));
            memo.set(n, r);
            return r;
        };
        return rec(f);
    }

    /** One satisfying assignment (levels not on the path are 0), or undefined for the constant 0. */
    satOne(f: BddNode): Uint8Array | undefined {
        if (f === Bdd.FALSE) return undefined;
        const bits = new Uint8Array(this.varCount);
        let n = f;
        while (n > 1) {
            const lo = this.lows[n]!;
            if (lo !== Bdd.FALSE) n = lo;
            else { bits[this.levels[n]!] = 1; n = this.highs[n]!; }
        }
        return bits;
    }

    /** Value at a complete assignment (bits[level]). */
    evaluate(f: BddNode, bits: ArrayLike<number>): boolean {
        let n = f;
        while (n > 1) n = bits[this.levels[n]!] ? this.highs[n]! : this.lows[n]!;
        return n === Bdd.TRUE;
    }
}
