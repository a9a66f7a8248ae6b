/**
 * Chevrotain 13 (used by Langium 4.4) calls `Object.groupBy` while building the parser; Node 20
 * lacks it (added in Node 21). Installing this small equivalent keeps the engines field honest.
 * Same code as scripts/node20-compat.mjs, which preloads it for `langium generate`.
 */
type GroupBy = <T>(items: Iterable<T>, keyOf: (item: T, index: number) => PropertyKey) => Partial<Record<PropertyKey, T[]>>;

export function installObjectGroupBy(): void {
    const target = Object as unknown as { groupBy?: GroupBy };
    if (typeof target.groupBy === 'function') return;
    const groupBy: GroupBy = (items, keyOf) => {
        const groups: Partial<Record<PropertyKey, unknown[]>> = Object.create(null);
        let index = 0;
        for (const item of items) {
            const key = keyOf(item, index++);
            (groups[key] ??= []).push(item);
        }
        return groups as never;
    };
    Object.defineProperty(Object, 'groupBy', { configurable: true, writable: true, value: groupBy });
}

installObjectGroupBy();
