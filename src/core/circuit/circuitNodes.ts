/** The fixed node names every circuit shares (SPICE-safe, lower case). */

/** Ground, SPICE's node 0. */
export const GROUND = "0";
/** The segment supply's node (its source `VSUP`). */
export const SUPPLY_NODE = "vsup";
/** The logic supply's node (its source `VLOGIC`): the net tied-on outputs hang from. */
export const LOGIC_NODE = "vlogic";
