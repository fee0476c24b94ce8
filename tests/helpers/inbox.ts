// Reads what the app really sent, from the fake mail server's REST API (maildev).
interface Mail { id: string; subject: string; text?: string; to: Array<{ address: string }> }

const base = (): string => `http://127.0.0.1:${process.env.MAIL_WEB_PORT ?? '1981'}/api`;

export async function mailsTo(address: string): Promise<Mail[]> {
  const res = await fetch(`${base()}/email?limit=500`);
  const body = (await res.json()) as Mail[] | { items: Mail[] };
  const list = Array.isArray(body) ? body : body.items;
  return list.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()));
}

/** Waits for the first e-mail to an address and returns it with its text. */
export async function waitForMail(address: string, timeoutMs = 5000): Promise<Mail & { text: string }> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    const found = await mailsTo(address);
    if (found[0]) {
      const full = (await (await fetch(`${base()}/email/${found[0].id}`)).json()) as Mail;
      return { ...full, text: full.text ?? '' };
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no e-mail reached ${address} within ${timeoutMs} ms`);
}

export const tokenFrom = (text: string): string => {
  const m = /token=([A-Za-z0-9_-]+)/.exec(text);
  if (!m) throw new Error('no token link in the e-mail');
  return m[1]!;
};
