/**
 * Text zod (v4, English locale) writes by default, and the lists of raw field keys our forms used to print: none of it
 * may reach a screen. Built from zod's en locale wording (node_modules/zod/v4/locales/en.js) and the key list pattern
 * "(title, modelId)".
 */
export const RAW_VALIDATOR_TEXT = new RegExp(
  [
    String.raw`Too (?:small|big): expected`,
    String.raw`Invalid input(?::|$|\s)`,
    String.raw`expected \w+, received \w+`,
    String.raw`Invalid (?:option|string|number|key|value|element|discriminator|email address|[A-Z]{2,})\b`,
    String.raw`Unrecognized keys?:`,
    String.raw`to have [<>]=?\d`,
    // a parenthesised list of field keys with at least one camelCase or dotted key: "(title, modelId)", "(stages.1.steps, notes)"
    String.raw`\((?=[^)]*(?:[a-z][A-Z]|\.\d))[\w.]+(?:, [\w.]+)+\)`,
  ].join("|"),
);
