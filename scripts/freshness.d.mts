/** Types for scripts/freshness.mjs (plain JavaScript, so the launcher can run it unbuilt). */
export type Build = 'cli' | 'renderer';
export declare const BUILD_SOURCES: Record<Build, string[]>;
export declare const BUILD_OUTPUTS: Record<Build, string>;
export declare function isCheckout(root: string): boolean;
export declare function staleReason(root: string, build: Build): string | null;
