/**
 * The words a newcomer meets in the app, explained once. The app shows each
 * beside the field or figure it explains (HelpTip) and all of them on its
 * help page (HelpPage); the README's glossary carries the same sentences,
 * and a unit test holds the two together.
 */

export interface HelpEntry {
  /** The term as the app shows it. */
  readonly term: string;
  /** One or two sentences, plain text. */
  readonly text: string;
}

export const HELP = {
  depthLimit: {
    term: "Depth limit",
    text: "The most diodes on any path from a counter line to a segment (1 to 3). Each diode on the way drops about 0.6 V, so a deeper path lights its segment a little less; with 1 every lit cell gets its own diode (the direct matrix) and nothing is shared.",
  },
  depthPolicy: {
    term: "Depth policy",
    text: "Which path lengths may meet in one segment. Per segment: every path into one segment has the same length, so one resistor per segment evens out its brightness. Mixed: any lengths. Uniform: every path in the matrix has the same length.",
  },
  busNode: {
    term: "Bus node",
    text: "A shared line: several counter lines each drive it through a diode, and it drives several segments through a diode each. It pays when many states light the same group of segments; on the drawing it is an extra column and row (B1, B2...).",
  },
  link: {
    term: "Link",
    text: "A diode from one segment's line to another's: where a segment is lit whenever another one is, the other's line can light it, saving the diodes from the counter lines. The linked segment sees one more diode drop.",
  },
  boundGap: {
    term: "Bound and gap",
    text: "The bound is a proven lower limit: no matrix for this project has fewer diodes. The gap is how far the shown count is above it; a gap of 0 means the count is the proven minimum.",
  },
  seed: {
    term: "Seed",
    text: "The starting number of the optimizer's random choices. The same project and seed always give the same matrix; another seed may find another matrix of the same or a different size.",
  },
  trim: {
    term: "Trim",
    text: "Replacing each segment's current-setting resistor with the E24 (or E96) value that brings its current nearest the target. By default it is applied only where it helps: never over a segment's rating, never a wider spread.",
  },
  spread: {
    term: "Spread",
    text: "How unevenly the segments are lit: 100 × (largest − smallest) / largest segment current, in percent, over every lit segment in every state. Lower is more even.",
  },
  corners: {
    term: "Corners",
    text: "The circuit solved again with every tolerance pushed the same way: the low corner (lowest supply, the resistors in each segment's path at the top of their tolerance, lowest transistor gain) and the high corner (the opposite). The design meets its target when every lit segment stays within the window around the target current at both.",
  },
  direct: {
    term: "Direct matrix",
    text: "One diode for every lit cell of every state, nothing shared: the starting point the optimizer improves on, and the count it is compared with.",
  },
  decoders: {
    term: "Decoders",
    text: "An instrument (a clock, a timer, a scoreboard) has several counters, each with its own decoder: its own states, display, glyphs and optimizer settings. Click one to open it in the panels. They share one set of electrical values; a value a decoder overrides in the file stays its own, and editing it changes that decoder alone.",
  },
  instrumentTotals: {
    term: "Instrument totals",
    text: "The parts of every decoder added up, and the supply current and power of the whole instrument: each decoder's worst state, summed. The counters run independently, so all of them can be in their worst state at once, and no other combination draws more.",
  },
  verified: {
    term: "Verified",
    text: "An independent check walked every path of the matrix from every state and found that exactly the intended segments light and no path is longer than the depth limit. Nothing unverified is shown.",
  },
} as const satisfies Readonly<Record<string, HelpEntry>>;

export type HelpTerm = keyof typeof HELP;

/** The entries in the order the help page and the README list them. */
export const HELP_ORDER: readonly HelpTerm[] = Object.keys(HELP) as HelpTerm[];
