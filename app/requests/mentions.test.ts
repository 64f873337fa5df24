import { describe, expect, it } from "vitest";
import { extractMentions, mentionQuery } from "./mentions";

const members = [
  { userId: "a", name: "Ann Test", email: "ann@test.example" },
  { userId: "b", name: "Anneliese Test", email: "anneliese@test.example" },
  { userId: "c", name: "Bo", email: "bo@test.example" },
];

describe("extractMentions", () => {
  it("finds whole names and e-mail addresses, case-insensitively", () => {
    expect(extractMentions("@ann test please check", members)).toEqual(["a"]);
    expect(extractMentions("cc @anneliese@test.example.", members)).toEqual(["b"]);
    expect(extractMentions("@Bo, and @Anneliese Test", members).sort()).toEqual(["b", "c"]);
  });
  it("ignores partial names and addresses without an @", () => {
    expect(extractMentions("@Anne please", members)).toEqual([]);
    expect(extractMentions("mail ann@test.example", members)).toEqual([]);
    expect(extractMentions("@Bob", members)).toEqual([]);
  });
});

describe("mentionQuery", () => {
  it("reads the handle being typed at the caret", () => {
    expect(mentionQuery("hello @An", 9)).toEqual({ start: 6, query: "An" });
    expect(mentionQuery("@", 1)).toEqual({ start: 0, query: "" });
    expect(mentionQuery("no mention here", 15)).toBeNull();
  });
});
