import { UsageError } from './io.js';

export interface FlagSpec {
    /** Takes a value (`--format json`); otherwise a boolean switch. */
    readonly value?: boolean;
    /** Allowed values, listed in the error for anything else. */
    readonly choices?: readonly string[];
    readonly alias?: string;
}

export interface ParsedArgs {
    readonly positionals: string[];
    readonly flags: Map<string, string | true>;
}

/** Parses `--name value`, `--name=value`, `-o value` and switches; unknown flags are usage errors listing the valid ones. */
export function parseArgs(command: string, args: readonly string[], spec: Readonly<Record<string, FlagSpec>>): ParsedArgs {
    const positionals: string[] = [];
    const flags = new Map<string, string | true>();
    const byAlias = new Map<string, string>();
    for (const [name, s] of Object.entries(spec)) if (s.alias) byAlias.set(s.alias, name);
    const valid = () => Object.keys(spec).map((n) => `--${n}`).join(', ');
    for (let i = 0; i < args.length; i++) {
        const arg = args[i]!;
        if (arg === '--') { positionals.push(...args.slice(i + 1)); break; }
        if (!arg.startsWith('-') || arg === '-') { positionals.push(arg); continue; }
        let name: string;
        let inline: string | undefined;
        if (arg.startsWith('--')) {
            const eq = arg.indexOf('=');
            name = eq < 0 ? arg.slice(2) : arg.slice(2, eq);
            inline = eq < 0 ? undefined : arg.slice(eq + 1);
        } else {
            const full = byAlias.get(arg.slice(1));
            if (!full) throw new UsageError(`detent ${command}: unknown option '${arg}' (valid: ${valid()})`);
            name = full;
        }
        const s = spec[name];
        if (!s) throw new UsageError(`detent ${command}: unknown option '--${name}' (valid: ${valid()})`);
        if (!s.value) {
            if (inline !== undefined) throw new UsageError(`detent ${command}: option '--${name}' takes no value`);
            flags.set(name, true);
            continue;
        }
        const value = inline ?? args[++i];
        if (value === undefined) throw new UsageError(`detent ${command}: option '--${name}' needs a value${s.choices ? ` (one of: ${s.choices.join(', ')})` : ''}`);
        if (s.choices && !s.choices.includes(value)) {
            throw new UsageError(`detent ${command}: '${value}' is not a valid value for --${name} (one of: ${s.choices.join(', ')})`);
        }
        flags.set(name, value);
    }
    return { positionals, flags };
}

export function stringFlag(parsed: ParsedArgs, name: string): string | undefined {
    const v = parsed.flags.get(name);
    return typeof v === 'string' ? v : undefined;
}
