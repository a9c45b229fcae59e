export declare const PACKAGE_ROOT: string;
export declare const DIST_DIR: string;
export declare const BUILD_STAMP: string;
export declare const BUILD_INPUTS: string[];
export declare function compiledBuildIsCurrent(root?: string): boolean;
export declare function runnableModule(relativeTsPath: string): { path: string; compiled: boolean };
