/**
 * Cost of a two-level network, as LANGUAGE.md defines it ("Synthesis"):
 *   literals    = Σ over equations of the literals of each product;
 *   gate inputs = Σ over equations of (literals of products with ≥ 2 literals) + (number of products, when ≥ 2).
 * Complemented literals are free (flip-flops provide Q and Q'; inputs are assumed available in
 * both phases). `products` counts product terms; `maxFanIn` is the widest AND or OR gate.
 * With `share`, an AND gate (a product) used by several equations is counted once in gate inputs
 * and products (multiple-output sharing); literals stay per equation as LANGUAGE.md defines them.
 */
import { type Cube, isUniverse, literalCount } from '../boolean/cube.js';
import type { Cost } from './types.js';

export function networkCost(covers: readonly (readonly Cube[])[], nvars: number, flipflops: number, share = false): Cost {
    let literals = 0;
    let gateInputs = 0;
    let products = 0;
    let maxFanIn = 0;
    const sharedGates = new Set<string>();
    for (const cover of covers) {
        const realProducts = cover.filter((c) => !isUniverse(c, nvars));
        const constantOne = realProducts.length < cover.length;
        if (constantOne) continue; // a constant 1 needs no gate
        for (const c of realProducts) {
            const n = literalCount(c, nvars);
            literals += n;
            if (n >= 2) {
                const key = Array.from(c).join(',');
                if (!share || !sharedGates.has(key)) {
                    gateInputs += n;
                    products++;
                    sharedGates.add(key);
                }
                maxFanIn = Math.max(maxFanIn, n);
            } else {
                products++;
            }
        }
        if (realProducts.length >= 2) {
            gateInputs += realProducts.length;
            maxFanIn = Math.max(maxFanIn, realProducts.length);
        }
    }
    return { flipflops, literals, gateInputs, products, maxFanIn };
}

/** Orders costs: gate inputs, then literals, then flip-flops, then products. Negative when a is cheaper. */
export function compareCost(a: Cost, b: Cost): number {
    return a.gateInputs - b.gateInputs || a.literals - b.literals || a.flipflops - b.flipflops || a.products - b.products;
}
