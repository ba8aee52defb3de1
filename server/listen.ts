import { createServer, type Server } from 'node:http';

/** The port is held by another program: said in one sentence, before anything else is done. */
export class PortTakenError extends Error {}

export const portTakenMessage = (port: number) =>
  `Gridset cannot start: port ${port} is taken by another program (another Gridset?). Stop it, or start with PORT=<another port>.`;

/** Listens on `port` (all addresses), or rejects: a PortTakenError when it is in use, the socket's error otherwise. */
export function listenOn(server: Server, port: number): Promise<void> {
  return new Promise((resolve, reject) => {
    const onError = (err: NodeJS.ErrnoException) => {
      server.off('listening', onListening);
      reject(err.code === 'EADDRINUSE' ? new PortTakenError(portTakenMessage(port)) : err);
    };
    const onListening = () => {
      server.off('error', onError);
      resolve();
    };
    server.once('error', onError);
    server.once('listening', onListening);
    server.listen(port);
  });
}

/** Whether the port can be had now: listens and lets go at once, so `npm start` says so before a long client build. */
export async function checkPortFree(port: number): Promise<void> {
  const probe = createServer();
  await listenOn(probe, port);
  await new Promise((resolve) => probe.close(resolve));
}
