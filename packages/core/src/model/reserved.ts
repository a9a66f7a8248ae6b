/**
 * Names an exported design cannot use. The language reports them as `reserved-name`; the
 * exporters reuse these lists (and name their own internals only from `EXPORT_GENERATED_NAMES`
 * or with the `EXPORT_INTERNAL_PREFIX`, so a user name can never collide with them).
 *
 * Keyword lists: Verilog-2005 from IEEE 1364-2005 Annex B, SystemVerilog-2017 from
 * IEEE 1800-2017 Annex B, VHDL-2008 from IEEE 1076-2008 §15.10, C11 from ISO/IEC 9899:2011
 * §6.4.1 (transcribed from those annexes; checked against them from memory, not by tool).
 */

const words = (text: string): readonly string[] => text.trim().split(/\s+/);

/** IEEE 1364-2005 Annex B (case-sensitive; all lowercase). */
export const VERILOG_2005_KEYWORDS: readonly string[] = words(`
always and assign automatic begin buf bufif0 bufif1 case casex casez cell cmos config deassign
default defparam design disable edge else end endcase endconfig endfunction endgenerate endmodule
endprimitive endspecify endtable endtask event for force forever fork function generate genvar
highz0 highz1 if ifnone incdir include initial inout input instance integer join large liblist
library localparam macromodule medium module nand negedge nmos nor noshowcancelled not notif0
notif1 or output parameter pmos posedge primitive pull0 pull1 pulldown pullup pulsestyle_ondetect
pulsestyle_onevent rcmos real realtime reg release repeat rnmos rpmos rtran rtranif0 rtranif1
scalared showcancelled signed small specify specparam strong0 strong1 supply0 supply1 table task
time tran tranif0 tranif1 tri tri0 tri1 triand trior trireg unsigned use uwire vectored wait wand
weak0 weak1 while wire wor xnor xor
`);

/** IEEE 1800-2017 Annex B: every Verilog-2005 keyword plus these (case-sensitive). */
const SYSTEMVERILOG_2017_ADDED: readonly string[] = words(`
accept_on alias always_comb always_ff always_latch assert assume before bind bins binsof bit break
byte chandle checker class clocking const constraint context continue cover covergroup coverpoint
cross dist do endchecker endclass endclocking endgroup endinterface endpackage endprogram
endproperty endsequence enum eventually expect export extends extern final first_match foreach
forkjoin global iff ignore_bins illegal_bins implements implies import inside int interconnect
interface intersect join_any join_none let local logic longint matches modport nettype new
nexttime null package packed priority program property protected pure rand randc randcase
randsequence ref reject_on restrict return s_always s_eventually s_nexttime s_until s_until_with
sequence shortint shortreal soft solve static string strong struct super sync_accept_on
sync_reject_on tagged this throughout timeprecision timeunit type typedef union unique unique0
until until_with untyped var virtual void wait_order weak wildcard with within
`);

export const SYSTEMVERILOG_2017_KEYWORDS: readonly string[] = [...VERILOG_2005_KEYWORDS, ...SYSTEMVERILOG_2017_ADDED];

/** IEEE 1076-2008 §15.10 (case-insensitive: compare lowercased). */
export const VHDL_2008_KEYWORDS: readonly string[] = words(`
abs access after alias all and architecture array assert assume assume_guarantee attribute begin
block body buffer bus case component configuration constant context cover default disconnect
downto else elsif end entity exit fairness file for force function generate generic group guarded
if impure in inertial inout is label library linkage literal loop map mod nand new next nor not
null of on open or others out package parameter port postponed procedure process property
protected pure range record register reject release rem report restrict restrict_guarantee return
rol ror select sequence severity shared signal sla sll sra srl strong subtype then to transport
type unaffected units until use variable vmode vprop vunit wait when while with xnor xor
`);

/**
 * Names the VHDL export makes visible through its context clause (`library ieee; use
 * ieee.std_logic_1164.all; use ieee.numeric_std.all;`) and package STANDARD: a port with one of
 * these names would hide the type or function the generated code needs. Case-insensitive.
 */
export const VHDL_CONTEXT_NAMES: readonly string[] = words(`
ieee std work std_logic_1164 numeric_std std_logic std_ulogic std_logic_vector std_ulogic_vector
rising_edge falling_edge to_unsigned to_integer resize boolean integer natural positive character
bit_vector severity_level true false
`);

/** ISO/IEC 9899:2011 §6.4.1, plus the `<stdbool.h>`/`<stdint.h>` names the C export includes. */
export const C11_KEYWORDS: readonly string[] = words(`
auto break case char const continue default do double else enum extern float for goto if inline
int long register restrict return short signed sizeof static struct switch typedef union unsigned
void volatile while _Alignas _Alignof _Atomic _Bool _Complex _Generic _Imaginary _Noreturn
_Static_assert _Thread_local bool true false NULL uint8_t uint16_t uint32_t uint64_t int8_t
int16_t int32_t int64_t size_t
`);

/** Names the exporters declare themselves (compared case-insensitively, for VHDL). */
export const EXPORT_GENERATED_NAMES: readonly string[] = ['state', 'next_state'];

/** Every internal name an exporter invents beyond EXPORT_GENERATED_NAMES starts with this. */
export const EXPORT_INTERNAL_PREFIX = 'detent_';

export type ReservedBy = 'Verilog-2005' | 'SystemVerilog-2017' | 'VHDL-2008' | 'VHDL context' | 'C11' | 'Detent exports';

const verilog = new Set(VERILOG_2005_KEYWORDS);
const systemVerilog = new Set(SYSTEMVERILOG_2017_KEYWORDS);
const vhdl = new Set(VHDL_2008_KEYWORDS);
const vhdlContext = new Set(VHDL_CONTEXT_NAMES);
const c11 = new Set(C11_KEYWORDS);
const generated = new Set(EXPORT_GENERATED_NAMES);

/** Which export targets reserve `name` (empty when it is free everywhere). */
export function reservedBy(name: string): ReservedBy[] {
    const lower = name.toLowerCase();
    const by: ReservedBy[] = [];
    if (verilog.has(name)) by.push('Verilog-2005');
    if (systemVerilog.has(name)) by.push('SystemVerilog-2017');
    if (vhdl.has(lower)) by.push('VHDL-2008');
    if (vhdlContext.has(lower)) by.push('VHDL context');
    if (c11.has(name)) by.push('C11');
    if (generated.has(lower) || lower.startsWith(EXPORT_INTERNAL_PREFIX)) by.push('Detent exports');
    return by;
}

/**
 * VHDL basic identifiers (IEEE 1076-2008 §15.4.2) start with a letter, do not end with `_` and
 * have no two adjacent underscores; Detent identifiers may. Returns why `name` breaks the rule.
 */
export function vhdlIdentifierProblem(name: string): string | undefined {
    if (name.startsWith('_')) return 'a VHDL name cannot start with an underscore';
    if (name.endsWith('_')) return 'a VHDL name cannot end with an underscore';
    if (name.includes('__')) return 'a VHDL name cannot contain two underscores in a row';
    return undefined;
}
