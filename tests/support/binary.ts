import type { Test } from 'supertest';

// superagent types a parser as the browser kind (text in) or the node kind (response, callback).
type NodeParser = Exclude<Parameters<Test['parse']>[0], (str: string) => unknown>;

/**
 * supertest parser that keeps a binary body (a zip) as one Buffer. Under node, superagent hands the
 * parser the raw http.IncomingMessage, which its types call Response.
 */
export const binary: NodeParser = (res, cb) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};
