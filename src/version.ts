// The program version, as package.json states it (a test keeps the two equal).
export const SLABECHO_VERSION = '0.1.0';
