// pipeline() and multi() for the embedded connection. The stock mock's Pipeline copies the
// mock's built-in commands and so bypasses this layer's overrides and scripts; this one
// queues calls to the connection's own methods. Every queued command starts synchronously
// one after the other in exec(), so no other client's command can interleave (MULTI's
// atomicity holds because each command, scripts included, runs to completion at once).

type Method = (...args: unknown[]) => Promise<unknown>;

export function createPipeline(
  client: Record<string | symbol, unknown>,
  queued: Array<[string, unknown[]]> = [],
): unknown {
  const batch: Array<[string, unknown[]]> = [...queued];
  const own: Record<string | symbol, unknown> = {};
  const exec = (callback?: (err: Error | null, res?: unknown) => void): Promise<Array<[Error | null, unknown]>> => {
    const items = batch.splice(0);
    const replies = items.map(([name, args]) => {
      try {
        return (client[name] as Method)(...args).then(
          (r) => [null, r] as [null, unknown],
          (e: Error) => [e, null] as [Error, null],
        );
      } catch (e) {
        return Promise.resolve([e as Error, null] as [Error, null]);
      }
    });
    const all = Promise.all(replies);
    if (callback)
      all.then(
        (r) => callback(null, r),
        (e: Error) => callback(e),
      );
    return all;
  };
  const proxy: unknown = new Proxy(own, {
    get(target, prop) {
      if (prop in target) return target[prop];
      if (prop === 'exec') return exec;
      if (prop === 'length') return batch.length;
      if (prop === 'then' || typeof prop === 'symbol') return undefined;
      if (typeof client[prop] !== 'function') return undefined;
      return (...args: unknown[]) => {
        batch.push([prop, args]);
        return proxy;
      };
    },
    set(target, prop, value) {
      target[prop] = value;
      return true;
    },
  });
  return proxy;
}
