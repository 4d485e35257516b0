/** The one function diodeloom uses from svgdom 0.1.22, which ships no types. */
declare module "svgdom" {
  export function createSVGWindow(): Window & typeof globalThis;
}
