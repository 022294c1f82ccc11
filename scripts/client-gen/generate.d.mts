export declare const openApiJsonPath: string;
export declare const clientTypesPath: string;
/** The types file's contents for the OpenAPI document at `path` (default: the committed one). */
export declare function renderClientTypes(path?: string): Promise<string>;
