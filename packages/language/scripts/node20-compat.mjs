// Chevrotain 13 (under Langium 4.4) calls Object.groupBy, which Node 20 lacks (Node 21+).
// Preloaded with `node --import` for `langium generate`; the runtime installs the same
// polyfill in src/compat/object-group-by.ts.
if (typeof Object.groupBy !== 'function') {
    Object.defineProperty(Object, 'groupBy', {
        configurable: true,
        writable: true,
        value(items, keyOf) {
            const groups = Object.create(null);
            let index = 0;
            for (const item of items) {
                const key = keyOf(item, index++);
                (groups[key] ??= []).push(item);
            }
            return groups;
        },
    });
}
