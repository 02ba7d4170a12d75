// Minimal typing of the part of Eleventy's programmatic API that cosmoledger build uses.
declare module "@11ty/eleventy" {
  export class Eleventy {
    constructor(input: string, output: string, options?: { configPath?: string; quietMode?: boolean });
    write(): Promise<unknown>;
    /** Silences Eleventy's own console output (errors are still thrown). */
    disableLogger(): void;
  }
}
