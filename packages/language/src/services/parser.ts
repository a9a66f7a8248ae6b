/**
 * Langium's parser behind the size limits: the text is prescanned and too-deep guards blanked
 * (same length and line breaks, see syntax/limits.ts) before the recursive-descent parser sees it,
 * so no input can overflow the stack — in the CLI and in the editor alike.
 */
import { type LangiumCoreServices, type LangiumParser, createLangiumParser } from 'langium';
import { prescan } from '../syntax/limits.js';

export function createDetentParser(services: LangiumCoreServices): LangiumParser {
    const parser = createLangiumParser(services);
    const parse = parser.parse.bind(parser);
    parser.parse = ((input: string, options?: Parameters<LangiumParser['parse']>[1]) => {
        // a byte-order mark is no character of the language; a space keeps every offset
        const text = input.charCodeAt(0) === 0xfeff ? ` ${input.slice(1)}` : input;
        return parse(prescan(text).text, options);
    }) as LangiumParser['parse'];
    return parser;
}
