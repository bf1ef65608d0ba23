import type { EntityType } from "@tagloom/contracts";
import { SpanMark } from "./span-mark";
import { typeCode } from "./type-codes";

/** An entity type as a key to the span look: its name drawn as a span, with its code under it. */
export function TypeKey({ type, code }: { type: Pick<EntityType, "name" | "color">; code?: string }) {
  return (
    <span className="inline-block pb-3 text-sm leading-6 font-medium text-ink-800">
      <SpanMark type={type.name} code={code ?? typeCode(type.name)} color={type.color} title={type.name}>
        {type.name}
      </SpanMark>
    </span>
  );
}
