package dev.termgate.translate;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Render;
import dev.termgate.query.Query;
import dev.termgate.query.SingleQuery;
import dev.termgate.query.Span;
import dev.termgate.schema.GraphSchema;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * A small stand-in for parser + analyzer + repair + engine, for testing the loop, the commands and the shell
 * in isolation: it knows three labels and two relationship types, refuses every write keyword, repairs an
 * unknown name with exactly one near match and reports the ranked candidates when there are several. The
 * real pipeline is tested against the same scripts in {@code StandardPipelineTest}.
 */
public final class ToyPipeline implements Pipeline.Factory {

    static final Set<String> LABELS = Set.of("Vessel", "Port", "Carrier", "PortCall");
    static final Set<String> TYPES = Set.of("OPERATES", "CALLS_AT");
    /** Names with two equally good candidates: repair must not choose, the model is asked again. */
    static final Map<String, List<String>> AMBIGUOUS = Map.of("Harbor", List.of("Port", "PortCall"));
    private static final Pattern WRITE = Pattern.compile("(?i)\\b(CREATE|MERGE|SET|DELETE|DETACH|REMOVE|FOREACH|DROP)\\b");
    private static final Pattern CALL = Pattern.compile("(?i)\\bCALL\\b");
    private static final Pattern LOAD = Pattern.compile("(?i)\\bLOAD\\s+CSV\\b");
    private static final Pattern LABEL = Pattern.compile("\\(\\s*\\w*\\s*:\\s*(\\w+)");
    private static final Pattern TYPE = Pattern.compile("\\[\\s*\\w*\\s*:\\s*(\\w+)");

    /** Every query text the runner was given, in order. */
    public final List<String> ran = new CopyOnWriteArrayList<>();
    /** How long a run takes (to test cancelling). */
    public volatile long runMillis = 0;

    @Override
    public Pipeline open(PipelineSpec spec) {
        return new Pipeline(GraphSchema.empty(), this::card, this::check, this::run, () -> {});
    }

    CardSource.Card card(String question) {
        String text = "labels: " + String.join(", ", new java.util.TreeSet<>(LABELS)) + "\nrelationships: (Carrier)-[:OPERATES]->(Vessel), (Vessel)-[:CALLS_AT]->(Port)\n";
        return new CardSource.Card(text, 42, List.copyOf(new java.util.TreeSet<>(LABELS)));
    }

    public Checked check(String text) {
        List<Diagnostic> ds = new ArrayList<>();
        boolean parsed = QueryExtractor.startsWithClause(text) && balanced(text)
                && (text.toUpperCase(Locale.ROOT).contains("RETURN") || WRITE.matcher(text).find())
                && !text.contains("garbage");
        if (!parsed) {
            ds.add(Diagnostic.at(Code.SYNTAX_ERROR, new Span(0, 1, 1, 1, 1, 2), "not a query this stand-in understands"));
            return new Checked(text, false, false, text, Optional.empty(), ds, List.of(), List.of(), Render.all(text, ds));
        }
        Matcher w = WRITE.matcher(text);
        while (w.find()) ds.add(Diagnostic.at(Code.WRITE_CLAUSE, span(text, w.start(), w.end()), w.group(1).toUpperCase(Locale.ROOT)));
        if (CALL.matcher(text).find()) ds.add(Diagnostic.at(Code.PROCEDURE_CALL, Span.NONE, "x"));
        if (LOAD.matcher(text).find()) ds.add(Diagnostic.at(Code.LOAD_CSV, Span.NONE));
        String repaired = text;
        List<Checked.Edit> edits = new ArrayList<>();
        List<Checked.TermUse> terms = new ArrayList<>();
        repaired = names(repaired, text, LABEL, LABELS, Code.UNKNOWN_LABEL, "label", ds, edits, terms);
        repaired = names(repaired, text, TYPE, TYPES, Code.UNKNOWN_RELATIONSHIP_TYPE, "relationship", ds, edits, terms);
        boolean valid = ds.stream().noneMatch(Diagnostic::isError);
        Optional<Query> tree = valid ? Optional.of(new Query(new SingleQuery(List.of(), Span.NONE), List.of(), Span.NONE)) : Optional.empty();
        return new Checked(text, true, valid, repaired, tree, ds, valid ? edits : List.of(), valid ? terms : List.of(), Render.all(text, ds));
    }

    private static String names(String current, String original, Pattern p, Set<String> known, Code code, String kind,
                                List<Diagnostic> ds, List<Checked.Edit> edits, List<Checked.TermUse> terms) {
        Matcher m = p.matcher(original);
        String out = current;
        while (m.find()) {
            String name = m.group(1);
            if (known.contains(name)) {
                terms.add(new Checked.TermUse(kind, name, "https://example.org/maritime#" + name, "direct"));
                continue;
            }
            List<String> near = AMBIGUOUS.containsKey(name) ? AMBIGUOUS.get(name)
                    : known.stream().filter(k -> close(k, name)).sorted().toList();
            Span at = span(original, m.start(1), m.end(1));
            if (near.size() == 1) {
                out = out.replaceFirst("(?<=:)\\s*" + Pattern.quote(name) + "\\b", near.get(0));
                edits.add(new Checked.Edit(kind + " '" + name + "' → '" + near.get(0) + "'", "line " + at.startLine() + ":" + at.startColumn(),
                        "the one ontology term this close"));
                terms.add(new Checked.TermUse(kind, near.get(0), "https://example.org/maritime#" + near.get(0), "direct"));
            } else {
                ds.add(Diagnostic.at(code, at, name).withSuggestions(near));
            }
        }
        return out;
    }

    /** Same letters ignoring case and separators, or a prefix of at least 4 letters. */
    private static boolean close(String known, String name) {
        String a = known.toLowerCase(Locale.ROOT).replace("_", "");
        String b = name.toLowerCase(Locale.ROOT).replace("_", "");
        return a.equals(b) || oneEditApart(a, b) || (b.length() >= 4 && a.startsWith(b)) || (a.length() >= 4 && b.startsWith(a) && b.length() - a.length() <= 1);
    }

    private static boolean oneEditApart(String a, String b) {
        if (Math.abs(a.length() - b.length()) > 1) return false;
        int i = 0;
        while (i < Math.min(a.length(), b.length()) && a.charAt(i) == b.charAt(i)) i++;
        return a.substring(i + (a.length() >= b.length() ? 1 : 0)).equals(b.substring(i + (b.length() >= a.length() ? 1 : 0)));
    }

    private static boolean balanced(String t) {
        int d = 0;
        for (char c : t.toCharArray()) {
            if (c == '(') d++;
            if (c == ')') d--;
            if (d < 0) return false;
        }
        return d == 0;
    }

    private static Span span(String text, int from, int to) {
        int line = 1;
        int col = 1;
        for (int i = 0; i < from; i++) {
            if (text.charAt(i) == '\n') {
                line++;
                col = 1;
            } else {
                col++;
            }
        }
        return new Span(from, to, line, col, line, col + (to - from));
    }

    RunResult run(Checked c, RunLimits limits) throws InterruptedException {
        if (!c.valid()) throw new IllegalStateException("the stand-in runner was given an invalid query");
        ran.add(c.query());
        if (runMillis > 0) Thread.sleep(runMillis);
        return new RunResult(List.of("name"), List.of(List.of("Northern Star"), List.of("Harbor Light")), false,
                "plan: stand-in for " + c.query(), List.of());
    }

    static Map<String, String> noEnv() {
        return Map.of();
    }
}
