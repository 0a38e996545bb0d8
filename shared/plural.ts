/** "1 cell", "41,000 cells": a count with its noun, thousands grouped, for messages of the page and the server alike. */
export const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en-US')} ${n === 1 ? one : many}`;
