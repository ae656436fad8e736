// Every request handler goes through `guard`: one failing feature answers empty and is logged,
// a cancelled request answers RequestCancelled, and the server keeps running either way.

import {
  LSPErrorCodes,
  ResponseError,
  type CancellationToken,
  type RemoteConsole,
} from 'vscode-languageserver/node';

export class Cancelled extends Error {
  constructor() {
    super('request cancelled');
  }
}

/** Throws Cancelled when the client gave up on the request; call between chunks of work. */
export function checkCancelled(token: CancellationToken | undefined): void {
  if (token?.isCancellationRequested) throw new Cancelled();
}

/** Lets queued messages (a cancellation, a newer edit) in before the next chunk of work. */
export function yieldToEvents(): Promise<void> {
  return new Promise((resolve) => setImmediate(resolve));
}

function describe(error: unknown): string {
  if (error instanceof Error) return error.stack ?? `${error.name}: ${error.message}`;
  return String(error);
}

type Handler<P, R> = (params: P, token: CancellationToken) => R | Promise<R>;

export function guard<P, R, E>(
  console: RemoteConsole,
  feature: string,
  empty: E,
  handler: Handler<P, R>,
): (params: P, token: CancellationToken) => Promise<R | E | ResponseError<void>> {
  return async (params, token) => {
    try {
      checkCancelled(token);
      const result = await handler(params, token);
      checkCancelled(token);
      return result;
    } catch (error) {
      if (error instanceof Cancelled || token.isCancellationRequested) {
        return new ResponseError(LSPErrorCodes.RequestCancelled, 'request cancelled');
      }
      console.error(`waveplan: ${feature} failed: ${describe(error)}`);
      return empty;
    }
  };
}

/** The same for notifications: nothing to answer, but an error must not escape. */
export function guardNotification<P>(
  console: RemoteConsole,
  feature: string,
  handler: (params: P) => void | Promise<void>,
): (params: P) => void {
  return (params) => {
    try {
      const pending = handler(params);
      if (pending) pending.catch((error: unknown) => console.error(`waveplan: ${feature} failed: ${describe(error)}`));
    } catch (error) {
      console.error(`waveplan: ${feature} failed: ${describe(error)}`);
    }
  };
}
