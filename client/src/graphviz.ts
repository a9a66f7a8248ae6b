// DOT → SVG in the extension host. The Graphviz WASM is inlined in @hpcc-js/wasm-graphviz's bundle,
// so the webview receives finished SVG and needs neither script evaluation nor WebAssembly.
import { Graphviz } from '@hpcc-js/wasm-graphviz';

let loading: Promise<Graphviz> | undefined;

function graphviz(): Promise<Graphviz> {
    loading ??= Graphviz.load();
    return loading;
}

export async function graphvizVersion(): Promise<string> {
    return (await graphviz()).version();
}

export async function dotToSvg(dot: string): Promise<string> {
    const gv = await graphviz();
    return gv.dot(dot, 'svg');
}
