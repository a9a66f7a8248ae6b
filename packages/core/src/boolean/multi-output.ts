/**
 * Multi-output minimization with product sharing: several functions over the same variables
 * may use the same AND term, so the PLA (or gate netlist) needs it once.
 *
 * Each function is first minimized alone (the baseline). Candidate products are the baseline
 * products and the pairwise intersections of products of different functions; a candidate may
 * serve every function whose ON ∪ DC contains it. A weighted covering problem then picks
 * candidates — a product costs once, however many functions use it — so that every function's
 * ON-set is covered; its rows are ON minterms added lazily, as in exact.ts. The baseline is the
 * upper bound, so sharing never costs more distinct products than minimizing apart.
 */
import { cpuNow } from './clock.js';
import { type Cube, isEmpty, wordsFor } from './cube.js';
import { dontCaresOutside } from './dont-care.js';
import { cubeLiteralCount } from './espresso/expand.js';
import { irredundant } from './espresso/irredundant.js';
import { coverHasCube, cubeCofactor, singleCubeContainment } from './espresso/unate.js';
import { firstMinterm, holeIn, lexicographicCover } from './exact.js';
import { type MinimizeOptions, minimize } from './minimize.js';
import { TABLE_VARS, functionTables, primesFromTable } from './primes-table.js';

export interface MultiFunction {
    readonly on: readonly Cube[];
    readonly dc: readonly Cube[];
}

export interface SharingCost {
    /** Products: with sharing, distinct products; apart, the sum over functions. */
    readonly products: number;
    /** Literals of those products, each product counted once. */
    readonly literals: number;
}

export interface MultiResult {
    /** One cover per function, using products from `products`. */
    readonly covers: Cube[][];
    /** The distinct products, shared among the covers. */
    readonly products: Cube[];
    /** For every product, the indices of the functions that use it. */
    readonly users: number[][];
    /** Each function minimized on its own (products counted once per function). */
    readonly apart: SharingCost;
    /** With sharing (each distinct product counted once). */
    readonly shared: SharingCost;
    /** True when every single-function minimization was proven minimal (the shared search is heuristic in its candidates). */
    readonly exactApart: boolean;
}

export interface MultiOptions extends MinimizeOptions {
    /** Largest number of candidate products for the sharing step (default 1500). */
    readonly maxCandidates?: number;
}

const key = (c: Cube): string => Array.from(c).join(',');

export function minimizeMulti(functions: readonly MultiFunction[], nvars: number, options: MultiOptions = {}): MultiResult {
    const start = cpuNow();
    const budget = options.budgetMs ?? 2000;
    const words = wordsFor(nvars);
    const alone = functions.map((f) => minimize(f.on, f.dc, nvars, { ...options, budgetMs: Math.max(1, budget / (2 * Math.max(1, functions.length))) }));
    const care = functions.map((f) => singleCubeContainment([...f.on, ...f.dc].filter((c) => !isEmpty(c, nvars)), words));
    const apart: SharingCost = {
        products: alone.reduce((s, r) => s + r.cover.length, 0),
        literals: alone.reduce((s, r) => s + r.cover.reduce((t, c) => t + cubeLiteralCount(c, nvars), 0), 0),
    };
    // Candidates: baseline products, then the multi-output primes when the functions are small
    // enough to tabulate (then the search below is exact), else intersections across functions.
    const cands: Cube[] = [];
    const seen = new Set<string>();
    const add = (c: Cube): void => { const k = key(c); if (!seen.has(k)) { seen.add(k); cands.push(c); } };
    alone.forEach((r) => r.cover.forEach(add));
    const baselineCount = cands.length;
    const maxCandidates = options.maxCandidates ?? 1500;
    const tabled = functions.length > 1 ? multiOutputPrimes(functions, nvars, maxCandidates) : null;
    if (tabled !== null) tabled.forEach(add);
    for (let i = 0; i < alone.length && cands.length < maxCandidates && tabled === null; i++) {
        for (let j = i + 1; j < alone.length && cands.length < maxCandidates; j++) {
            for (const a of alone[i]!.cover) for (const b of alone[j]!.cover) {
                if (cands.length >= maxCandidates) break;
                const x = new Uint32Array(words);
                for (let w = 0; w < words; w++) x[w] = a[w]! & b[w]!;
                if (!isEmpty(x, nvars)) add(x);
            }
        }
    }
    const valid: number[][] = cands.map((c) => functions.flatMap((_, f) => (coverHasCube(care[f]!, c, nvars) ? [f] : [])));
    // Baseline as a selection of candidates, and its cost.
    const candLiterals = cands.map((c) => cubeLiteralCount(c, nvars));
    let baselineLiterals = 0;
    for (let j = 0; j < baselineCount; j++) baselineLiterals += candLiterals[j]!;
    let chosen: number[] = Array.from({ length: baselineCount }, (_, j) => j);

    if (functions.length > 1 && cpuNow() < start + budget) {
        const rows: number[][] = [];
        const rowKeys = new Set<string>();
        const addRow = (f: number, m: Cube): void => {
            const cols: number[] = [];
            for (let j = 0; j < cands.length; j++) {
                if (!valid[j]!.includes(f)) continue;
                const c = cands[j]!;
                let inside = true;
                for (let w = 0; w < words; w++) if (((c[w]! & m[w]!) >>> 0) !== m[w]) { inside = false; break; }
                if (inside) cols.push(j);
            }
            const k = cols.join(',');
            if (cols.length > 0 && !rowKeys.has(k)) { rowKeys.add(k); rows.push(cols); }
        };
        functions.forEach((fn, f) => fn.on.forEach((c) => { if (!isEmpty(c, nvars)) addRow(f, firstMinterm(c, nvars)); }));
        /** Rows for the ON minterms of every function that the columns leave bare; how many. */
        const grow = (columns: readonly number[]): number => {
            let missing = 0;
            functions.forEach((fn, f) => {
                const mine = columns.filter((j) => valid[j]!.includes(f)).map((j) => cands[j]!);
                for (const c of fn.on) {
                    if (isEmpty(c, nvars)) continue;
                    const hole = holeIn(cubeCofactor(mine, c, nvars), nvars);
                    if (hole === null) continue;
                    const m = new Uint32Array(words);
                    for (let w = 0; w < words; w++) m[w] = c[w]! & hole[w]!;
                    addRow(f, firstMinterm(m, nvars));
                    missing++;
                }
            });
            return missing;
        };
        // Bounded by counted work (deterministic, like minimize's exact step); the budget is a safety net.
        const sol = lexicographicCover(candLiterals, rows, { products: baselineCount, literals: baselineLiterals }, {
            maxPrimes: Infinity, maxRows: 1_000_000, deadline: start + budget, maxWork: options.exactWork ?? 16_000_000,
        }, grow);
        if (sol?.columns) chosen = sol.columns;
    }
    // Per-function covers from the chosen products, made irredundant for that function.
    const covers = functions.map((fn, f) => {
        const mine = chosen.filter((j) => valid[j]!.includes(f)).map((j) => cands[j]!);
        return irredundant(mine, dontCaresOutside(fn.dc.filter((c) => !isEmpty(c, nvars)), fn.on.filter((c) => !isEmpty(c, nvars)), nvars), nvars);
    });
    const used = new Map<string, { cube: Cube; users: number[] }>();
    covers.forEach((cv, f) => cv.forEach((c) => {
        const k = key(c);
        const u = used.get(k);
        if (u) u.users.push(f);
        else used.set(k, { cube: c, users: [f] });
    }));
    const products = [...used.values()].map((u) => u.cube);
    const shared: SharingCost = { products: products.length, literals: products.reduce((s, c) => s + cubeLiteralCount(c, nvars), 0) };
    return { covers, products, users: [...used.values()].map((u) => u.users), apart, shared, exactApart: alone.every((r) => r.exact) };
}

/** Largest function count whose output subsets are enumerated for multi-output primes. */
const MAX_TABLED_FUNCTIONS = 6;

/**
 * The multi-output primes: for every non-empty set S of the functions, the primes of the
 * product of their ON ∪ DC that meet some ON-set in S. Every cover with shared products can be
 * made of these without more products (grow each product, used by S, to a prime of S's product),
 * so a covering search over them is exact. Null beyond the table size or `limit` primes.
 */
function multiOutputPrimes(functions: readonly MultiFunction[], nvars: number, limit: number): Cube[] | null {
    if (nvars > TABLE_VARS || functions.length > MAX_TABLED_FUNCTIONS) return null;
    const size = 1 << nvars;
    const tables = functions.map((f) => functionTables(f.on, f.dc, nvars));
    const out: Cube[] = [];
    const seen = new Set<number>();
    const care = new Uint8Array(size);
    const on = new Uint8Array(size);
    for (let set = 1; set < 1 << functions.length; set++) {
        care.fill(1);
        on.fill(0);
        functions.forEach((_, i) => {
            if (!((set >> i) & 1)) return;
            const c = tables[i]!.care;
            const o = tables[i]!.on;
            for (let m = 0; m < size; m++) { care[m]! &= c[m]!; on[m]! |= o[m]!; }
        });
        for (let m = 0; m < size; m++) on[m]! &= care[m]!;
        const primes = primesFromTable(on, care, nvars, limit);
        if (primes === null) return null;
        for (const p of primes) if (!seen.has(p[0]!)) { seen.add(p[0]!); out.push(p); }
        if (out.length > limit) return null;
    }
    return out;
}
