/**
 * Matrix Market exchange format (Boisvert, Pozo & Remington 1996, "The Matrix
 * Market Exchange Formats: Initial Design", NIST): reading and writing.
 */
export { readMatrixMarket } from "./market-read.js";
export type { MarketContents, MarketSparse, MarketDense, MarketField } from "./market-read.js";
export { writeMatrixMarket, writeMatrixMarketArray } from "./market-write.js";
export type { MarketWriteOptions, MarketArrayWriteOptions } from "./market-write.js";
