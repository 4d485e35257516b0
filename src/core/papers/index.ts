/** Stage "papers": what the builder takes to the bench, as data and plain text (parts count, wiring list, SPICE decks, CSV). */
export { countParts, refRanges } from "./parts.ts";
export type { PartGroup, PartKind } from "./parts.ts";
export { INSPECTION_CHECKLIST, LOGIC_SUPPLY_NET, TIE_ON_HEADING, WIRING_HEADER, tieOnRows, wiringCsv, wiringRows } from "./wiringList.ts";
export type { DrawingPosition, TieOnRow, WiringRow } from "./wiringList.ts";
export { circuitNetlist, spiceNetlist, spiceNetlists, segmentLedNode } from "./netlist.ts";
export { csvField, csvText } from "./csv.ts";
