export declare const NON_PAGE_CSP: string;
export declare function securityHeaders(site: { https: boolean }): Record<string, string>;
