/**
 * Mentions in review comments (issue 7: "mentions of a member notify them").
 * The "@" rule (not inside a word, so an e-mail address in running text is not
 * a mention) is common practice in chat and code-review tools. Members are the
 * invented Brookmere Biofluidics team.
 */
import { describe, expect, it } from "vitest";
import { DomainError, ForbiddenError } from "@/lib/errors";
import { parseMentions, planComment, type MentionableMember } from "@/lib/review/mentions";

const members: MentionableMember[] = [
  { id: "m-ada", name: "Ada Quill", email: "ada@brookmere.example" },
  { id: "m-adam", name: "Ada Quillon", email: "adam.q@brookmere.example" },
  { id: "m-bo", name: "Bo Lindqvist", email: "bo@brookmere.example" },
  { id: "m-zoe", name: "Zoë Ferreira", email: "zoe.f@brookmere.example" },
];

describe("parseMentions", () => {
  it("finds a full name, case-insensitively, and an e-mail address", () => {
    expect(parseMentions("@ada quill please check s3", members)).toEqual(["m-ada"]);
    expect(parseMentions("cc @bo@brookmere.example.", members)).toEqual(["m-bo"]);
  });

  it("prefers the longest name, so one name that starts another is not confused with it", () => {
    expect(parseMentions("@Ada Quillon, see the mixer", members)).toEqual(["m-adam"]);
    expect(parseMentions("@Ada Quill, see the mixer", members)).toEqual(["m-ada"]);
  });

  it("needs the name to end at a word boundary", () => {
    expect(parseMentions("@Bo Lindqvistson", members)).toEqual([]);
  });

  it("ignores an address in running text, unknown names and a bare @", () => {
    expect(parseMentions("write to ada@brookmere.example or @nobody @ here", members)).toEqual([]);
  });

  it("lists each member once, in order of first mention, across line breaks and accented names", () => {
    expect(parseMentions("@Zoë Ferreira and @Bo\nLindqvist, then @zoe.f@brookmere.example again", members)).toEqual(["m-zoe", "m-bo"]);
  });
});

describe("planComment", () => {
  const author = { memberId: "m-bo", roles: ["fluidics_reviewer"] as const };

  it("notifies the mentioned members but not the author", () => {
    const plan = planComment(author, "  @Ada Quill @Bo Lindqvist the Re flag on s3 is fine  ", members, { segmentId: "s3" });
    expect(plan.body).toBe("@Ada Quill @Bo Lindqvist the Re flag on s3 is fine");
    expect(plan.mentionedMemberIds).toEqual(["m-ada"]);
    expect(plan.notifications).toEqual([{ kind: "mentioned", to: [{ memberId: "m-ada" }], details: { excerpt: plan.body } }]);
    expect(plan.audit).toEqual({ action: "review.commented", details: { segmentId: "s3", point: null, parentId: null, mentioned: ["m-ada"] } });
  });

  it("sends nothing when nobody is mentioned", () => {
    expect(planComment(author, "Looks fine.", members).notifications).toEqual([]);
  });

  it("refuses empty comments and bad pins (400), and leads writing (403)", () => {
    expect(() => planComment(author, "   ", members)).toThrow(DomainError);
    expect(() => planComment(author, "x", members, { point: { x_m: Number.NaN, y_m: 0 } })).toThrow(/pin/);
    const e = (() => {
      try {
        planComment({ memberId: "m-rafe", roles: ["lead"] }, "Nice", members);
      } catch (err) {
        return err;
      }
    })();
    expect(e).toBeInstanceOf(ForbiddenError);
    expect((e as DomainError).status).toBe(403);
  });
});
