package dev.termgate.query;

import java.util.List;

/**
 * Label and relationship-type expressions: {@code :A:B} and GQL's {@code :A&B}, {@code :A|B}, {@code :!A}, {@code :%}.
 * {@code :A:B} and {@code :A&B} read to the same tree; the printer writes a conjunction of plain names as {@code :A:B}.
 */
public sealed interface LabelExpr extends Node {

    record Name(String name, Span span) implements LabelExpr {}

    record And(List<LabelExpr> operands, Span span) implements LabelExpr {
        public And { operands = List.copyOf(operands); }
    }

    record Or(List<LabelExpr> operands, Span span) implements LabelExpr {
        public Or { operands = List.copyOf(operands); }
    }

    record Not(LabelExpr operand, Span span) implements LabelExpr {}

    /** {@code %}: any label. */
    record Wildcard(Span span) implements LabelExpr {}
}
