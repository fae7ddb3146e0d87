export declare const APP_SOURCES: readonly string[];
export declare function newestMtime(p: string): number;
export declare function newestSourceMtime(root: string, sources?: readonly string[]): number;
