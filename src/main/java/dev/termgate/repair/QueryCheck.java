package dev.termgate.repair;

import dev.termgate.analyze.Analysis;
import dev.termgate.analyze.Analyzer;
import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.query.Printer;
import dev.termgate.query.Query;
import dev.termgate.query.Span;
import dev.termgate.schema.GraphSchema;

import java.util.List;
import java.util.Optional;

/**
 * The one call every command and the translation loop use to check a query text: parse, analyze against the
 * schema (or schema-free), apply certain repairs, and audit the ontology terms. Thread-safe.
 *
 * <pre>{@code
 * CheckResult r = QueryCheck.check(text, schema, QueryCheck.Mode.REPAIR);
 * if (r.valid()) run(r.runnableTree().get()); else reask(r.report());
 * }</pre>
 */
public final class QueryCheck {

    public enum Mode {
        /** Apply certain repairs; a query that is valid after them counts as valid. */
        REPAIR,
        /** Only report; a query is valid only as written. */
        CHECK_ONLY
    }

    private static final CypherParser PARSER = new CypherParser();

    private QueryCheck() {}

    /** Checks against the schema with repair; {@code schema} null means schema-free. */
    public static CheckResult check(String text, GraphSchema schema) {
        return check(text, schema, Mode.REPAIR);
    }

    /** Scope, typing, function and read-only checks only (no ontology). */
    public static CheckResult checkSchemaFree(String text, Mode mode) {
        return check(text, null, mode);
    }

    /** {@code schema} null means schema-free. */
    public static CheckResult check(String text, GraphSchema schema, Mode mode) {
        ParseResult parsed = PARSER.parse(text);
        if (!parsed.isValid()) {
            return new CheckResult(text, Optional.empty(), parsed.diagnostics(), Optional.empty(), Optional.empty(),
                    Optional.empty(), List.of(), parsed.diagnostics(), List.of(), List.of(), false);
        }
        return check(text, parsed.tree(), schema, mode);
    }

    /** Checks a tree already parsed from {@code text} (the interpreter and tests build trees directly). */
    public static CheckResult check(String text, Query tree, GraphSchema schema, Mode mode) {
        Analyzer analyzer = Analyzer.forSchema(schema);
        Analysis first;
        try {
            first = analyzer.analyze(tree);
        } catch (StackOverflowError e) {
            // The parser bounds nesting, but a tree built by hand might not be.
            List<Diagnostic> d = List.of(Diagnostic.at(Code.TOO_DEEP, tree.span().isNone() ? Span.NONE : tree.span(),
                    CypherParser.MAX_DEPTH));
            return new CheckResult(text, Optional.of(tree), d, Optional.empty(), Optional.empty(), Optional.empty(),
                    List.of(), d, List.of(), List.of(), false);
        }
        Optional<String> canonical = Optional.of(Printer.print(tree));
        if (mode == Mode.CHECK_ONLY || !first.hasErrors()) {
            return new CheckResult(text, Optional.of(tree), first.diagnostics(), canonical, Optional.empty(),
                    Optional.empty(), List.of(), first.diagnostics(),
                    first.fixes().stream().filter(f -> f.diagnostic().isError()).toList(), first.terms(), !first.hasErrors());
        }
        RepairResult r = Repairer.repair(tree, first, analyzer);
        Analysis last = r.after();
        return new CheckResult(text, Optional.of(tree), first.diagnostics(), canonical, r.tree(),
                r.tree().map(Printer::print), r.edits(), last.diagnostics(), r.unresolved(), last.terms(),
                !last.hasErrors());
    }
}
