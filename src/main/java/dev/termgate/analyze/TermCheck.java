package dev.termgate.analyze;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Expr;
import dev.termgate.query.LabelExpr;
import dev.termgate.query.Node;
import dev.termgate.query.Pattern;
import dev.termgate.query.Query;
import dev.termgate.query.Span;
import dev.termgate.query.Trees;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;

/**
 * Every label, relationship type and property key must be defined by the ontology; an unknown one gets its
 * nearest defined names as ranked fixes. Deprecated terms are a warning. Records each term used (the audit).
 */
final class TermCheck implements Check {

    /** At most this many suggestions per unknown name (common practice: a short list is read, a long one not). */
    static final int MAX_SUGGESTIONS = 5;

    @Override
    public boolean needsSchema() {
        return true;
    }

    @Override
    public void run(Query query, Context cx) {
        Set<String> warned = new HashSet<>();
        for (Pattern.NodePattern np : cx.nodes(query, Pattern.NodePattern.class)) {
            np.labels().ifPresent(l -> names(l, TermKind.LABEL, cx, warned));
        }
        for (Pattern.RelPattern rp : cx.nodes(query, Pattern.RelPattern.class)) {
            rp.types().ifPresent(l -> names(l, TermKind.RELATIONSHIP, cx, warned));
        }
        for (Expr.HasLabels h : cx.nodes(query, Expr.HasLabels.class)) {
            Binding b = h.target() instanceof Expr.Variable v ? cx.binding(v) : null;
            TermKind kind = b != null && b.type == Type.RELATIONSHIP ? TermKind.RELATIONSHIP : TermKind.LABEL;
            names(h.labels(), kind, cx, warned);
        }
        for (Context.PropertyUse use : cx.properties) {
            if (use.target().type != Type.NODE && use.target().type != Type.RELATIONSHIP && use.target().type != Type.ANY) {
                continue;
            }
            Optional<TermInfo> info = cx.schema.property(use.key()).map(p -> p.info());
            if (info.isPresent()) {
                cx.use(TermKind.PROPERTY, use.key(), use.keySpan(), TermUse.Via.DIRECT);
                deprecated(info.get(), use.node(), cx, warned);
            } else {
                unknown(TermKind.PROPERTY, use.key(), use.node(), cx);
            }
        }
    }

    private void names(LabelExpr expr, TermKind kind, Context cx, Set<String> warned) {
        for (LabelExpr.Name n : Trees.find(expr, LabelExpr.Name.class)) {
            Optional<TermInfo> info = kind == TermKind.LABEL ? cx.schema.label(n.name()).map(l -> l.info())
                    : cx.schema.relType(n.name()).map(r -> r.info());
            if (info.isPresent()) {
                cx.use(kind, n.name(), n.span(), TermUse.Via.DIRECT);
                deprecated(info.get(), n, cx, warned);
            } else {
                unknown(kind, n.name(), n, cx);
            }
        }
    }

    private static void deprecated(TermInfo info, Node at, Context cx, Set<String> warned) {
        if (info.deprecated() && warned.add(info.kind() + info.name())) {
            cx.report(Diagnostic.of(Code.DEPRECATED_TERM, at, info.kind().word(), info.name()));
        }
    }

    private static void unknown(TermKind kind, String name, Node at, Context cx) {
        Code code = switch (kind) {
            case LABEL -> Code.UNKNOWN_LABEL;
            case RELATIONSHIP -> Code.UNKNOWN_RELATIONSHIP_TYPE;
            case PROPERTY -> Code.UNKNOWN_PROPERTY;
        };
        List<Candidate> candidates = new ArrayList<>();
        for (Lenient.Match m : cx.index.lenient(kind).lookup(name)) {
            if (candidates.size() == MAX_SUGGESTIONS) break;
            candidates.add(renaming(kind, at, name, m));
        }
        cx.report(Diagnostic.of(code, at, name), candidates);
    }

    private static Candidate renaming(TermKind kind, Node at, String before, Lenient.Match m) {
        String after = m.name();
        FixKind fk = switch (kind) {
            case LABEL -> FixKind.REPLACE_LABEL;
            case RELATIONSHIP -> FixKind.REPLACE_RELATIONSHIP_TYPE;
            case PROPERTY -> FixKind.REPLACE_PROPERTY;
        };
        return new Candidate(fk, at, n -> rename(n, after), before, after,
                "'" + before + "' is not in the ontology; '" + after + "': " + m.why(), m.score());
    }

    /** The node with its term renamed; the span stays, so the edit can point at the original text. */
    static Node rename(Node n, String to) {
        Span s = n.span();
        if (n instanceof LabelExpr.Name) return new LabelExpr.Name(to, s);
        if (n instanceof Expr.Property p) return new Expr.Property(p.target(), to, s);
        if (n instanceof Expr.MapEntry e) return new Expr.MapEntry(to, e.value(), s);
        if (n instanceof Expr.PropertySelector) return new Expr.PropertySelector(to, s);
        throw new IllegalArgumentException("cannot rename a " + n.getClass().getSimpleName());
    }
}
