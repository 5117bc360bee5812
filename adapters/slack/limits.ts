/**
 * Block Kit limits (Slack's Block Kit reference): what a message may carry. render.ts keeps within
 * them; checkBlocks() tells whether a list of blocks does, for tests and for safety at run time.
 */
export const LIMITS = {
  blocksPerMessage: 50,
  sectionText: 3000,
  sectionFields: 10,
  fieldText: 2000,
  contextElements: 10,
  contextText: 2000,
  headerText: 150,
  buttonText: 75,
  buttonValue: 2000,
  actionId: 255,
  actionsElements: 25,
  fallbackText: 40000,
} as const;

type Text = { type: "mrkdwn" | "plain_text"; text: string };
export type Block =
  | { type: "section"; text?: Text; fields?: Text[]; block_id?: string }
  | { type: "context"; elements: Text[] }
  | { type: "header"; text: Text }
  | { type: "divider" }
  | {
      type: "actions";
      elements: {
        type: "button";
        text: Text;
        action_id: string;
        value?: string;
        style?: "primary" | "danger";
        confirm?: { title: Text; text: Text; confirm: Text; deny: Text };
      }[];
    };

/** Every limit this list of blocks breaks; empty when it keeps them all. */
export function checkBlocks(blocks: readonly Block[]): string[] {
  const broken: string[] = [];
  if (blocks.length > LIMITS.blocksPerMessage)
    broken.push(`${blocks.length} blocks > ${LIMITS.blocksPerMessage}`);
  blocks.forEach((b, i) => {
    if (b.type === "section") {
      if (!b.text && !b.fields) broken.push(`block ${i}: section needs text or fields`);
      if (b.text && b.text.text.length > LIMITS.sectionText)
        broken.push(`block ${i}: section text ${b.text.text.length}`);
      if (b.text && b.text.text.length === 0) broken.push(`block ${i}: empty section text`);
      if (b.fields && b.fields.length > LIMITS.sectionFields)
        broken.push(`block ${i}: ${b.fields.length} fields`);
      for (const f of b.fields ?? [])
        if (f.text.length > LIMITS.fieldText || f.text.length === 0)
          broken.push(`block ${i}: field ${f.text.length}`);
    } else if (b.type === "context") {
      if (b.elements.length > LIMITS.contextElements || b.elements.length === 0)
        broken.push(`block ${i}: ${b.elements.length} context elements`);
      for (const e of b.elements)
        if (e.text.length > LIMITS.contextText || e.text.length === 0)
          broken.push(`block ${i}: context text ${e.text.length}`);
    } else if (b.type === "header") {
      if (b.text.type !== "plain_text" || b.text.text.length > LIMITS.headerText)
        broken.push(`block ${i}: header`);
    } else if (b.type === "actions") {
      if (b.elements.length > LIMITS.actionsElements) broken.push(`block ${i}: ${b.elements.length} actions`);
      for (const e of b.elements) {
        if (e.text.type !== "plain_text" || e.text.text.length > LIMITS.buttonText)
          broken.push(`block ${i}: button text`);
        if ((e.value?.length ?? 0) > LIMITS.buttonValue)
          broken.push(`block ${i}: button value ${e.value?.length}`);
        if (e.action_id.length > LIMITS.actionId) broken.push(`block ${i}: action_id`);
      }
    }
  });
  return broken;
}
