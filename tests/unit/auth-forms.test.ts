import { describe, expect, it } from "vitest";
import { fieldErrors, formObject, ResetPasswordForm, RolesForm, SignUpForm } from "~/auth/forms";
import { normaliseRoles } from "~/auth/roles";
import { tooManyAttemptsMessage, clientAddress } from "~/auth/rate-limit.server";

describe("sign-up form", () => {
  const ok = { displayName: "Rowan", email: " Rowan@Example.COM ", password: "ten chars!" };

  it("accepts a sensible sign-up and trims the address", () => {
    const parsed = SignUpForm.parse(ok);
    expect(parsed.email).toBe("Rowan@Example.COM");
  });

  it("names each bad field with its own message", () => {
    const result = SignUpForm.safeParse({ displayName: "  ", email: "not-an-address", password: "short" });
    expect(result.success).toBe(false);
    expect(fieldErrors(result.error!)).toEqual({
      displayName: "Enter the name other people on Loadline will see.",
      email: "Enter a valid e-mail address, like name@example.com.",
      password: "Use at least 10 characters.",
    });
  });

  // bcrypt uses only the first 72 bytes of a password (bcryptjs README: "The maximum input length
  // is 72 bytes"), so longer ones are refused rather than silently shortened.
  it("refuses passwords longer than bcrypt reads, counting bytes not letters", () => {
    expect(SignUpForm.safeParse({ ...ok, password: "a".repeat(72) }).success).toBe(true);
    expect(SignUpForm.safeParse({ ...ok, password: "a".repeat(73) }).success).toBe(false);
    // 30 × "ö" is 60 bytes in UTF-8; 40 × is 80.
    expect(SignUpForm.safeParse({ ...ok, password: "ö".repeat(30) }).success).toBe(true);
    expect(SignUpForm.safeParse({ ...ok, password: "ö".repeat(40) }).success).toBe(false);
  });
});

describe("reset form", () => {
  it("puts a mismatch on the confirmation field", () => {
    const result = ResetPasswordForm.safeParse({ password: "a-long-password", confirm: "another-password" });
    expect(fieldErrors(result.error!)).toEqual({ confirm: "The two passwords are not the same." });
  });
});

describe("roles form", () => {
  it("reads a checkbox group and refuses unknown roles", () => {
    const form = new FormData();
    form.append("userId", "7d0c2a56-3f7a-4c55-9a49-0c5b0d1d2e3f");
    form.append("roles", "seller");
    form.append("roles", "moderator");
    expect(RolesForm.parse(formObject(form, ["roles"])).roles).toEqual(["seller", "moderator"]);
    form.append("roles", "superuser");
    expect(RolesForm.safeParse(formObject(form, ["roles"])).success).toBe(false);
  });

  it("keeps buyer on every account, in a fixed order", () => {
    expect(normaliseRoles(["admin", "seller"])).toEqual(["buyer", "seller", "admin"]);
    expect(normaliseRoles([])).toEqual(["buyer"]);
    expect(normaliseRoles(["root", "moderator"])).toEqual(["buyer", "moderator"]);
  });
});

describe("rate-limit wording and client address", () => {
  it("says seconds for a short wait and rounds a longer one up to whole minutes", () => {
    expect(tooManyAttemptsMessage(1)).toBe("Too many sign-in attempts; try again in 1 second.");
    expect(tooManyAttemptsMessage(16)).toBe("Too many sign-in attempts; try again in 16 seconds.");
    expect(tooManyAttemptsMessage(60)).toBe("Too many sign-in attempts; try again in 1 minute.");
    expect(tooManyAttemptsMessage(61)).toBe("Too many sign-in attempts; try again in 2 minutes.");
    expect(tooManyAttemptsMessage(15 * 60)).toBe("Too many sign-in attempts; try again in 15 minutes.");
  });

  it("takes the hop our own proxy appended, not what the client wrote first", () => {
    const req = (xff?: string) => new Request("http://app.test/sign-in", { headers: xff ? { "x-forwarded-for": xff } : {} });
    expect(clientAddress(req("198.51.100.7"))).toBe("198.51.100.7");
    expect(clientAddress(req("203.0.113.9, 198.51.100.7"))).toBe("198.51.100.7");
    expect(clientAddress(req())).toBeNull();
  });
});
