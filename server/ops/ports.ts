/**
 * A port already in use stops start-up with one sentence naming the variable that moves it,
 * instead of a stack trace from deep inside net.listen.
 */
import net from "node:net";

export interface WantedPort {
  port: number;
  host: string;
  /** The environment variable that sets it: PORT, FAKE_SMTP_PORT, FAKE_MAILBOX_HTTP_PORT, FAKE_PAYMENTS_PORT. */
  variable: string;
}

export function isAddressInUse(e: unknown): boolean {
  return (e as NodeJS.ErrnoException | undefined)?.code === "EADDRINUSE";
}

/** Which of these ports cannot be listened on now (port 0 always can: the system picks one). */
export async function busyPorts(wanted: WantedPort[]): Promise<WantedPort[]> {
  const busy: WantedPort[] = [];
  for (const w of wanted) {
    if (w.port === 0) continue;
    const free = await new Promise<boolean>((resolve) => {
      const probe = net.createServer();
      probe.once("error", (e) => resolve(!isAddressInUse(e)));
      probe.listen({ port: w.port, host: w.host, exclusive: true }, () => probe.close(() => resolve(true)));
    });
    if (!free) busy.push(w);
  }
  return busy;
}

export function portsInUseSentence(busy: WantedPort[]): string {
  const list = busy.map((b) => `${b.port} (${b.variable})`).join(", ");
  const vars = busy.map((b) => b.variable).join(", ");
  return busy.length === 1
    ? `Phasebook cannot start: port ${list} is already in use, probably by another Phasebook; set ${busy[0].variable} to a free port or stop the other program.`
    : `Phasebook cannot start: ports ${list} are already in use, probably by another Phasebook; set ${vars} to free ports or stop the other program.`;
}
