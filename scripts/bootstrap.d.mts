export declare const root: string;
export declare function step(n: number, total: number, text: string): void;
export declare function ensurePackages(log?: (line: string) => void): void;
export declare function loadTypeScript(): Promise<void>;
