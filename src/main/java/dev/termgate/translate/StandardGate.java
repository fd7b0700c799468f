package dev.termgate.translate;

import dev.termgate.analyze.Analysis;
import dev.termgate.analyze.Analyzer;
import dev.termgate.analyze.Candidate;
import dev.termgate.analyze.Fix;
import dev.termgate.analyze.TermUse;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Render;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.query.Printer;
import dev.termgate.query.Query;
import dev.termgate.repair.Edit;
import dev.termgate.repair.RepairResult;
import dev.termgate.repair.Repairer;
import dev.termgate.schema.GraphSchema;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;

/**
 * The gate of the shipped commands: the project's parser, the analyzer against the ontology's schema (which
 * refuses every write or side-effect clause), and the certain repairs. Stateless apart from the analyzer, so
 * one gate serves every batch worker.
 */
public final class StandardGate implements QueryGate {

    private final Analyzer analyzer;

    public StandardGate(Analyzer analyzer) {
        this.analyzer = analyzer;
    }

    public static StandardGate forSchema(GraphSchema schema, boolean schemaFree) {
        return new StandardGate(schemaFree ? Analyzer.schemaFree() : Analyzer.forSchema(schema));
    }

    @Override
    public Checked check(String text) {
        ParseResult parsed = new CypherParser().parse(text);
        if (!parsed.isValid()) {
            return new Checked(text, false, false, text, Optional.empty(), parsed.diagnostics(), List.of(), List.of(), parsed.render());
        }
        Query tree = parsed.tree();
        Analysis analysis = analyzer.analyze(tree);
        if (!analysis.hasErrors()) {
            return accepted(text, text, tree, analysis, List.of());
        }
        RepairResult repair = Repairer.repair(tree, analysis, analyzer);
        if (!repair.after().hasErrors() && repair.repaired()) {
            Query fixed = repair.tree().get();
            List<Checked.Edit> edits = repair.edits().stream().map(StandardGate::edit).toList();
            return accepted(text, Printer.print(fixed), fixed, repair.after(), edits);
        }
        // What is shown (and sent back to a model) is about the text it wrote, with every candidate ranked.
        List<Diagnostic> ds = withCandidates(analysis.diagnostics(), repair.unresolved());
        return new Checked(text, true, false, text, Optional.empty(), ds, List.of(), List.of(), Render.all(text, ds));
    }

    private static Checked accepted(String source, String shown, Query tree, Analysis analysis, List<Checked.Edit> edits) {
        List<Checked.TermUse> terms = analysis.terms().stream().map(StandardGate::term).toList();
        return new Checked(source, true, true, shown, Optional.of(tree), analysis.diagnostics(), edits, terms,
                Render.all(source, analysis.diagnostics()));
    }

    /** Adds the ranked candidates of the fixes repair could not decide to the diagnostics they belong to. */
    private static List<Diagnostic> withCandidates(List<Diagnostic> ds, List<Fix> unresolved) {
        List<Diagnostic> out = new ArrayList<>();
        for (Diagnostic d : ds) {
            Diagnostic x = d;
            for (Fix f : unresolved) {
                if (f.diagnostic().code() == d.code() && f.diagnostic().span().equals(d.span()) && !f.candidates().isEmpty()) {
                    Set<String> names = new LinkedHashSet<>(d.suggestions());
                    f.candidates().stream().map(Candidate::after).forEach(names::add);
                    x = d.withSuggestions(List.copyOf(names));
                }
            }
            out.add(x);
        }
        return out;
    }

    private static Checked.Edit edit(Edit e) {
        String where = e.span().isNone() ? "" : "line " + e.span().startLine() + ":" + e.span().startColumn();
        return new Checked.Edit(e.kind().word() + " '" + e.before() + "' → '" + e.after() + "'", where, e.reason());
    }

    private static Checked.TermUse term(TermUse t) {
        return new Checked.TermUse(t.kind().name().toLowerCase(Locale.ROOT), t.name(), t.iri(), t.via().word());
    }
}
