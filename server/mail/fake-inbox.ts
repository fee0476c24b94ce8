import { MailDev } from 'maildev';

/**
 * The local fake mail server (maildev) with its web inbox, bound to loopback only (maildev listens on
 * all interfaces unless told otherwise).
 */
export async function startFakeInbox(smtpPort: number, webPort: number): Promise<{ stop: () => Promise<void> }> {
  const maildev = new MailDev({ smtp: smtpPort, web: webPort, ip: '127.0.0.1', webIp: '127.0.0.1', mcp: false, silent: true });
  await maildev.start();
  return { stop: () => maildev.stop() };
}
