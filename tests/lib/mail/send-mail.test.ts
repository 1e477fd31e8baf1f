// The SMTP path against a real SMTP server (the smtp-server package) on loopback, and the
// local outbox path. What arrives over SMTP is parsed by Python's email package, an
// independent RFC 5322 parser.
import { execFileSync } from "node:child_process";
import type { AddressInfo } from "node:net";
import { SMTPServer } from "smtp-server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listOutbox } from "@/db/queries/outbox";
import { scopeForTrustedCode } from "@/db/queries/scope";
import type { DemoContext } from "@/db/seed";
import { sendMail } from "@/lib/mail";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";

let demo: DemoContext;
const received: { from: string; to: string[]; raw: string }[] = [];
let server: SMTPServer;
let port = 0;

beforeAll(async () => {
  demo = (await useTempDatabase())!;
  server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", () => {
        received.push({
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : "",
          to: session.envelope.rcptTo.map((r) => r.address),
          raw: Buffer.concat(chunks).toString("utf8"),
        });
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", () => resolve()));
  port = (server.server.address() as AddressInfo).port;
});
afterAll(async () => {
  delete process.env.SMTP_URL;
  await new Promise<void>((resolve) => server.close(() => resolve()));
  dropTempDatabase();
});

describe("sendMail", () => {
  it("delivers over SMTP when SMTP_URL is set, and stores nothing in the outbox", async () => {
    process.env.SMTP_URL = `smtp://127.0.0.1:${port}`;
    process.env.MAIL_FROM = "Stokeline <no-reply@stokeline.test>";
    const result = await sendMail({ to: "reviewer@brookmere.test", subject: "Review requested: Gradient chip r3", text: "Open https://stokeline.test/x to review.\nThanks." });
    delete process.env.SMTP_URL;
    expect(result.transport).toBe("smtp");
    expect(received).toHaveLength(1);
    expect(received[0].from).toBe("no-reply@stokeline.test");
    expect(received[0].to).toEqual(["reviewer@brookmere.test"]);
    const parsed = JSON.parse(
      execFileSync("/usr/bin/python3", [
        "-c",
        "import email,json,sys; m=email.message_from_string(sys.stdin.read()); print(json.dumps({'subject':m['Subject'],'to':m['To'],'from':m['From'],'body':m.get_payload(decode=True).decode()}))",
      ], { input: received[0].raw }).toString(),
    );
    expect(parsed.subject).toBe("Review requested: Gradient chip r3");
    expect(parsed.to).toBe("reviewer@brookmere.test");
    expect(parsed.from).toBe("Stokeline <no-reply@stokeline.test>");
    expect(parsed.body.replace(/\r\n/g, "\n").trim()).toBe("Open https://stokeline.test/x to review.\nThanks.");
    const scope = scopeForTrustedCode({ userId: demo.users["admin@brookmere.test"], workspaceId: demo.workspaces.brookmere.id, roles: ["admin"] });
    expect(await listOutbox(scope)).toHaveLength(0);
  });

  it("reports an SMTP refusal as an error instead of pretending it was sent", async () => {
    process.env.SMTP_URL = "smtp://127.0.0.1:1";
    await expect(sendMail({ to: "a@b.test", subject: "x", text: "y" })).rejects.toThrow();
    delete process.env.SMTP_URL;
  });

  it("stores the message in the outbox when SMTP_URL is unset, visible to that workspace's admins only", async () => {
    const result = await sendMail({ to: "lead@brookmere.test", subject: "Hello", text: "Body", workspaceId: demo.workspaces.brookmere.id });
    expect(result.transport).toBe("outbox");
    const brookmere = scopeForTrustedCode({ userId: demo.users["admin@brookmere.test"], workspaceId: demo.workspaces.brookmere.id, roles: ["admin"] });
    const halvard = scopeForTrustedCode({ userId: demo.users["admin@halvard.test"], workspaceId: demo.workspaces.halvard.id, roles: ["admin"] });
    expect((await listOutbox(brookmere)).map((m) => m.subject)).toEqual(["Hello"]);
    expect(await listOutbox(halvard)).toHaveLength(0);
    // Account mail (no workspace) shows to admins of every workspace the recipient belongs to.
    await sendMail({ to: "fab@brookmere.test", subject: "Reset", text: "r" });
    expect((await listOutbox(halvard)).map((m) => m.subject)).toEqual(["Reset"]);
    expect((await listOutbox(brookmere)).map((m) => m.subject)).toEqual(["Reset", "Hello"]);
  });
});
