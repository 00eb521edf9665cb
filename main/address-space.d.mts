// Types of main/address-space.mjs (plain JavaScript, because main/launch.mjs runs before any build).
export declare const NO_TRAP_HANDLER: string;
export declare function addressSpaceLimit(limitsText?: string): number | undefined;
export declare function needsRestartWithoutTrapHandler(): boolean;
