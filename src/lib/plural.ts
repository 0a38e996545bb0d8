/** "1 cell", "41,000 cells": a count with its noun, the count written as the rest of the app writes numbers. */
export const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en-US')} ${n === 1 ? one : many}`;
