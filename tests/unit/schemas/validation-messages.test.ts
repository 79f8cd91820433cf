import { describe, expect, it } from "vitest";
import { z } from "zod";
import { createPlanRequestSchema } from "../../../shared/schemas/plans";
import { loginRequestSchema, modelProfileInputSchema } from "../../../shared/schemas";
import { acceleratorInputSchema } from "../../../shared/schemas/budget";
import { fieldLabel, issueSentence, plainSentence, summarizeFields } from "../../../shared/validation-messages";
import { issuesToFields } from "../../../server/platform/validate";
import { RAW_VALIDATOR_TEXT } from "../../setup/raw-validator-text";

const fieldsOf = (schema: z.ZodType, value: unknown) => {
  const r = schema.safeParse(value);
  if (r.success) throw new Error("expected the value to be refused");
  return issuesToFields(r.error);
};

describe("validation messages in our own words", () => {
  it("names a field by its path, list entries by position counted from 1", () => {
    expect(fieldLabel(["title"])).toBe("title");
    expect(fieldLabel(["modelId"])).toBe("model");
    expect(fieldLabel(["revision", "targetContext"])).toBe("target context");
    expect(fieldLabel(["revision", "stages", 1, "steps"])).toBe("steps of stage 2");
    expect(fieldLabel(["revision", "acceptance", 0, "threshold"])).toBe("threshold of criterion 1");
    expect(fieldLabel(["roles", 0])).toBe("role 1");
    expect(fieldLabel([])).toBe("the form");
  });

  it("an empty new-plan form: one sentence per field, each naming it, none in zod's words", () => {
    const fields = fieldsOf(createPlanRequestSchema, { title: "", modelId: undefined, revision: {} });
    expect(fields.title).toBe("Title is required.");
    expect(fields.modelId).toBe("Model is required.");
    for (const message of Object.values(fields)) {
      expect(message).toMatch(/^[A-Z].*\.$/);
      expect(message).not.toMatch(RAW_VALIDATOR_TEXT);
    }
  });

  it("numbers: missing, not a number, not whole, out of range", () => {
    const num = z.object({ steps: z.number().int().min(1).max(1_000_000) });
    expect(fieldsOf(num, {}).steps).toBe("Steps is required.");
    expect(fieldsOf(num, { steps: Number.NaN }).steps).toBe("Steps must be a number.");
    expect(fieldsOf(num, { steps: "12" }).steps).toBe("Steps must be a number.");
    expect(fieldsOf(num, { steps: 1.5 }).steps).toBe("Steps must be a whole number.");
    expect(fieldsOf(num, { steps: 0 }).steps).toBe("Steps must be at least 1.");
    expect(fieldsOf(num, { steps: 2e6 }).steps).toBe("Steps must be at most 1,000,000.");
    expect(fieldsOf(z.object({ lr: z.number().positive() }), { lr: 0 }).lr).toBe("Lr must be more than 0.");
  });

  it("text, e-mail, choices, lists and unknown keys", () => {
    expect(fieldsOf(loginRequestSchema, { email: "nope", password: "x" }).email).toMatch(/^E-mail must be an e-mail/);
    // An empty box is missing, not malformed.
    expect(fieldsOf(loginRequestSchema, { email: "", password: "" }).email).toBe("E-mail is required.");
    const choice = z.object({ comparison: z.enum([">=", "<="]) });
    expect(fieldsOf(choice, { comparison: "=" }).comparison).toBe('Comparison must be one of ">=" or "<=".');
    const list = z.object({ stages: z.array(z.number()).min(1) });
    expect(fieldsOf(list, { stages: [] }).stages).toBe("Stages needs at least 1 entry.");
    const strict = z.strictObject({ a: z.number() });
    expect(fieldsOf(strict, { a: 1, b: 2 })["(body)"]).toBe('The form has a field we do not accept: "b".');
  });

  it("a schema's own fragments become sentences naming the field, identifiers spelled out", () => {
    expect(plainSentence(["kvHeads"], "cannot exceed attentionHeads")).toBe(
      "Key/value heads cannot exceed attention heads.",
    );
    expect(plainSentence(["target"], "one of vllm, sglang")).toBe("Target must be one of vllm, sglang.");
    expect(plainSentence(["modelId"], "retired")).toBe("Model is retired.");
    expect(plainSentence(["beta"], "beta must exceed alpha")).toBe("Beta must exceed alpha.");
    expect(plainSentence(["steps"], "required unless tokens is given")).toBe(
      "Steps is required unless tokens is given.",
    );
    // Our own sentences pass through unchanged; zod's raw wording never does.
    expect(plainSentence(["title"], "Title is required.")).toBe("Title is required.");
    expect(plainSentence(["title"], "Too small: expected string to have >=1 characters")).toBe("Title is not valid.");
    const fields = fieldsOf(modelProfileInputSchema, { name: "x", headDim: 128, attentionHeads: 8, kvHeads: 16 });
    expect(fields.kvHeads ?? "").not.toMatch(RAW_VALIDATOR_TEXT);
  });

  it("the 400's message lists the first sentences and counts the rest", () => {
    expect(summarizeFields({ a: "A is required.", b: "B is required." })).toBe("A is required. B is required.");
    const many = { a: "A.", b: "B.", c: "C.", d: "D.", e: "E." };
    expect(summarizeFields(many)).toBe("A. B. C. And 2 more values need fixing.");
  });

  it("every message the accelerator form can raise for empty input is plain", () => {
    const fields = fieldsOf(acceleratorInputSchema, {});
    expect(Object.keys(fields).length).toBeGreaterThan(0);
    for (const message of Object.values(fields)) expect(message).not.toMatch(RAW_VALIDATOR_TEXT);
    expect(issueSentence({ code: "invalid_type", path: ["name"], input: undefined, expected: "string" })).toBe(
      "Name is required.",
    );
  });
});
