export const CONTRACT_VERSION = 1;
