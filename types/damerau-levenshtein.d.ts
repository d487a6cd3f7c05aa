declare module 'damerau-levenshtein' {
  /** The optimal string alignment distance between two strings (steps), and relative measures. */
  export default function damerauLevenshtein(a: string, b: string, limit?: number): { steps: number; relative: number; similarity: number };
}
