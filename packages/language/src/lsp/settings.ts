/**
 * The editor settings of section `detent` (see protocol.ts `DetentSettings`), kept as a synchronous
 * snapshot so providers can read them without awaiting. Sources, later ones win: defaults, the
 * client's initializationOptions, `workspace/configuration` at start, `didChangeConfiguration`.
 */
import type { LangiumSharedServices } from 'langium/lsp';
import { type Disposable, Emitter, type Event } from 'langium';
import type { DetentSettings } from './protocol.js';

export const DEFAULT_SETTINGS: DetentSettings = { encoding: 'machine', flipflop: 'machine', severity: {} };

function asRecord(value: unknown): Record<string, unknown> | undefined {
    return typeof value === 'object' && value !== null && !Array.isArray(value) ? value as Record<string, unknown> : undefined;
}

/** Accepts `{detent: {...}}` or the section itself; ignores fields of the wrong type. */
export function readSettings(raw: unknown, base: DetentSettings = DEFAULT_SETTINGS): DetentSettings {
    const outer = asRecord(raw);
    const section = asRecord(outer?.['detent']) ?? outer;
    if (!section) return base;
    const severity: Record<string, string> = {};
    const rawSeverity = asRecord(section['severity']);
    if (rawSeverity) for (const [code, value] of Object.entries(rawSeverity)) if (typeof value === 'string') severity[code] = value;
    return {
        encoding: typeof section['encoding'] === 'string' ? section['encoding'] : base.encoding,
        flipflop: typeof section['flipflop'] === 'string' ? section['flipflop'] : base.flipflop,
        severity: rawSeverity ? severity : base.severity,
    };
}

export class DetentSettingsStore {
    private current: DetentSettings = DEFAULT_SETTINGS;
    private readonly changed = new Emitter<DetentSettings>();

    get settings(): DetentSettings {
        return this.current;
    }

    get onDidChange(): Event<DetentSettings> {
        return this.changed.event;
    }

    update(raw: unknown): void {
        const next = readSettings(raw, this.current);
        if (JSON.stringify(next) === JSON.stringify(this.current)) return;
        this.current = next;
        this.changed.fire(next);
    }

    /** Follows the client: initialize options, then every configuration update of section `detent`. */
    attach(shared: LangiumSharedServices): Disposable[] {
        const server = shared.lsp.LanguageServer;
        const config = shared.workspace.ConfigurationProvider;
        return [
            server.onInitialize((params) => this.update(params.initializationOptions)),
            server.onInitialized(() => {
                void Promise.all([
                    config.getConfiguration('detent', 'encoding'),
                    config.getConfiguration('detent', 'flipflop'),
                    config.getConfiguration('detent', 'severity'),
                ]).then(([encoding, flipflop, severity]) => this.update({ encoding, flipflop, severity }), () => undefined);
            }),
            config.onConfigurationSectionUpdate((update) => {
                if (update.section === 'detent') this.update(update.configuration);
            }),
        ];
    }
}
