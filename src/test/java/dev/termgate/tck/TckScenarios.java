package dev.termgate.tck;

import io.cucumber.gherkin.GherkinParser;
import io.cucumber.messages.types.Envelope;
import io.cucumber.messages.types.Pickle;
import io.cucumber.messages.types.PickleStep;
import io.cucumber.messages.types.PickleTable;
import io.cucumber.messages.types.PickleTableRow;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.net.JarURLConnection;
import java.net.URISyntaxException;
import java.net.URL;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.Collections;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.jar.JarEntry;
import java.util.jar.JarFile;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;

/**
 * The scenarios of the openCypher TCK (Maven artifact {@code org.opencypher:tck:1.0.0-M23}, test scope), read
 * from the jar on the test classpath with the Cucumber Gherkin parser. Scenario Outlines are expanded into one
 * scenario per example row (Gherkin "pickles"). Shared by the parser, analyzer and engine tests; keep the API
 * stable.
 *
 * <p>Which TCK error details are a parser matter and which belong to the analyzer is listed in
 * {@link #PARSER_ERROR_DETAILS} and {@link #ANALYZER_ERROR_DETAILS}.
 */
public final class TckScenarios {

    /** Compile-time SyntaxError details that a grammar must raise (openCypher TCK, error detail codes). */
    public static final Set<String> PARSER_ERROR_DETAILS = Set.of(
            "UnexpectedSyntax", "InvalidNumberLiteral", "InvalidUnicodeLiteral", "InvalidUnicodeCharacter",
            "InvalidRelationshipPattern",
            // literals out of range cannot be held by the tree (a long, a finite double): the parser refuses them
            "IntegerOverflow", "FloatingPointOverflow");

    /**
     * Compile-time error details that need scope or type analysis (the analyzer's matter). Listed from the M23
     * feature files (grep "should be raised at compile time"); {@link #compileTimeDetails()} gives the measured
     * set and its counts. Scenarios: {@code TckScenarios.all()} filtered by {@code expectedError().detail()}.
     */
    public static final Set<String> ANALYZER_ERROR_DETAILS = Set.of(
            "InvalidArgumentType", "VariableTypeConflict", "VariableAlreadyBound", "UndefinedVariable",
            "InvalidAggregation", "AmbiguousAggregationExpression", "NoSingleRelationshipType",
            "InvalidNumberOfArguments", "InvalidParameterUse", "NegativeIntegerArgument", "NonConstantExpression",
            "InvalidClauseComposition", "ColumnNameConflict", "CreatingVarLength", "DifferentColumnsInUnion",
            "InvalidDelete", "ProcedureNotFound", "RequiresDirectedRelationship",
            "InvalidArgumentPassingMode", "MissingParameter", "NestedAggregation", "NoExpressionAlias",
            "NoVariablesInScope", "RelationshipUniquenessViolation", "UnknownFunction");

    /** How a scenario's graph starts. */
    public enum GraphKind { EMPTY, ANY, NAMED }

    /** The outcome a scenario expects. */
    public enum Outcome { RESULT, ERROR, NONE }

    /** {@code a SyntaxError should be raised at compile time: UndefinedVariable} → (SyntaxError, compile time, UndefinedVariable). */
    public record ExpectedError(String type, String phase, String detail) {
        public boolean atCompileTime() {
            return phase.equals("compile time");
        }
    }

    /**
     * An expected result table: the header and rows as written in the feature file (values are openCypher
     * value literals in the TCK's notation). {@code ordered} for "in order"; {@code ignoreListOrder} for
     * "(ignoring element order for lists)".
     */
    public record Table(List<String> header, List<List<String>> rows, boolean ordered, boolean ignoreListOrder) {
        public Table {
            header = List.copyOf(header);
            rows = rows.stream().map(List::copyOf).toList();
        }
    }

    /** A procedure the scenario declares ({@code there exists a procedure …}); signature text and its table. */
    public record Procedure(String signature, List<List<String>> table) {}

    /**
     * One concrete scenario.
     *
     * @param feature     the feature file path inside the jar, e.g. {@code features/clauses/match/Match1.feature}
     * @param name        the scenario name (with outline values substituted)
     * @param line        the line of the scenario (or of its example row) in the feature file
     * @param graphName   for {@link GraphKind#NAMED}, e.g. {@code binary-tree-1}
     * @param setup       queries of the {@code having executed:} steps, in order
     * @param parameters  name → value literal text from {@code parameters are:}
     * @param query       the query of the {@code When executing query:} step (empty if the scenario has none)
     * @param controlQueries queries of {@code executing control query:} steps (run after the query)
     * @param sideEffects e.g. {@code +nodes} → 1; empty for "no side effects" or when none is stated
     * @param sideEffectsStated whether the scenario states side effects at all
     */
    public record Scenario(String feature, String name, int line, List<String> tags, GraphKind graph,
                           Optional<String> graphName, List<String> setup, Map<String, String> parameters,
                           List<Procedure> procedures, Optional<String> query, List<String> controlQueries,
                           Outcome outcome, Optional<Table> expectedTable, Optional<ExpectedError> expectedError,
                           Map<String, Integer> sideEffects, boolean sideEffectsStated) {

        /** A short identifier for reports: {@code Match1.feature:42 [3] name}. */
        public String id() {
            return feature.substring(feature.lastIndexOf('/') + 1) + ":" + line + " " + name;
        }

        public boolean expectsResult() {
            return outcome == Outcome.RESULT;
        }

        public boolean expectsCompileError() {
            return expectedError.map(ExpectedError::atCompileTime).orElse(false);
        }

        public boolean expectsSyntaxError(String detail) {
            return expectedError.map(e -> e.atCompileTime() && e.detail().equals(detail)).orElse(false);
        }

        /** True when the scenario reports a changed graph. */
        public boolean hasSideEffects() {
            return sideEffects.values().stream().anyMatch(v -> v != 0);
        }

        /**
         * An update scenario writes, or its query holds a write clause (even when the write changes nothing).
         * Read-only is the rest. Keyword test on the query with strings and comments removed; see
         * {@link #hasWriteKeyword(String)}.
         */
        public boolean isUpdate() {
            return hasSideEffects() || query.map(TckScenarios::hasWriteKeyword).orElse(false);
        }

        public boolean isReadOnly() {
            return !isUpdate();
        }
    }

    private static final Pattern WRITE_WORD = Pattern.compile(
            "(?<![.:$\\w])(CREATE|MERGE|SET|DELETE|REMOVE|FOREACH|LOAD\\s+CSV|CALL)(?!\\w)", Pattern.CASE_INSENSITIVE);

    private static volatile List<Scenario> cache;

    private TckScenarios() {}

    /** Every concrete scenario of the TCK, in feature-file order (files sorted by path). */
    public static List<Scenario> all() {
        List<Scenario> c = cache;
        if (c == null) {
            synchronized (TckScenarios.class) {
                c = cache;
                if (c == null) {
                    c = Collections.unmodifiableList(load());
                    cache = c;
                }
            }
        }
        return c;
    }

    /** Scenarios whose query has no write clause and which report no side effects. */
    public static List<Scenario> readOnly() {
        return all().stream().filter(Scenario::isReadOnly).toList();
    }

    public static List<Scenario> updates() {
        return all().stream().filter(Scenario::isUpdate).toList();
    }

    /** Read-only scenarios that expect a result table (possibly empty). */
    public static List<Scenario> readOnlyWithResult() {
        return all().stream().filter(s -> s.isReadOnly() && s.expectsResult() && s.query().isPresent()).toList();
    }

    /** Scenarios expecting a compile-time error of the given detail, e.g. {@code UndefinedVariable}. */
    public static List<Scenario> withCompileError(String detail) {
        return all().stream().filter(s -> s.expectsSyntaxError(detail)).toList();
    }

    /** Read-only scenarios with a compile-time error whose detail is an analyzer matter. */
    public static List<Scenario> analyzerErrorScenarios() {
        return all().stream().filter(s -> s.expectsCompileError()
                && !PARSER_ERROR_DETAILS.contains(s.expectedError().get().detail())).toList();
    }

    /** Scenarios expecting a compile-time error that a parser must raise. */
    public static List<Scenario> parserErrorScenarios() {
        return all().stream().filter(s -> s.expectsCompileError()
                && PARSER_ERROR_DETAILS.contains(s.expectedError().get().detail())).toList();
    }

    /** Compile-time error details with their scenario counts, most frequent first. */
    public static Map<String, Long> compileTimeDetails() {
        Map<String, Long> counts = new LinkedHashMap<>();
        all().stream().filter(Scenario::expectsCompileError)
                .forEach(s -> counts.merge(s.expectedError().get().detail(), 1L, Long::sum));
        Map<String, Long> sorted = new LinkedHashMap<>();
        counts.entrySet().stream().sorted(Map.Entry.<String, Long>comparingByValue().reversed()
                        .thenComparing(Map.Entry.comparingByKey()))
                .forEach(e -> sorted.put(e.getKey(), e.getValue()));
        return sorted;
    }

    /**
     * True when the query text holds a write or side-effect clause keyword (CREATE, MERGE, SET, DELETE,
     * REMOVE, FOREACH, LOAD CSV, CALL) outside string literals, comments and backtick names. CALL counts as a
     * side effect because a procedure may do anything (the tool refuses it, like a write); with it the counts
     * match the facts measured on M23 (3,527 read-only).
     */
    public static boolean hasWriteKeyword(String query) {
        return WRITE_WORD.matcher(stripLiterals(query)).find();
    }

    /** Blanks out string literals, backtick names and comments so keyword tests do not see their contents. */
    static String stripLiterals(String q) {
        StringBuilder sb = new StringBuilder(q.length());
        int i = 0;
        while (i < q.length()) {
            char ch = q.charAt(i);
            if (ch == '\'' || ch == '"' || ch == '`') {
                int j = i + 1;
                while (j < q.length() && q.charAt(j) != ch) {
                    if (q.charAt(j) == '\\' && ch != '`') j++;
                    j++;
                }
                sb.append(' ');
                i = j + 1;
            } else if (ch == '/' && i + 1 < q.length() && q.charAt(i + 1) == '/') {
                int nl = q.indexOf('\n', i);
                i = nl < 0 ? q.length() : nl;
            } else if (ch == '/' && i + 1 < q.length() && q.charAt(i + 1) == '*') {
                int end = q.indexOf("*/", i + 2);
                i = end < 0 ? q.length() : end + 2;
                sb.append(' ');
            } else {
                sb.append(ch);
                i++;
            }
        }
        return sb.toString();
    }

    // ---- reading the jar ----

    private static List<Scenario> load() {
        List<Scenario> out = new ArrayList<>();
        GherkinParser parser = GherkinParser.builder().includeSource(false).includeGherkinDocument(false)
                .includePickles(true).build();
        for (Map.Entry<String, byte[]> f : featureFiles().entrySet()) {
            try (Stream<Envelope> envelopes = parser.parse(f.getKey(), f.getValue())) {
                envelopes.forEach(e -> {
                    e.getParseError().ifPresent(err -> {
                        throw new IllegalStateException("TCK feature unreadable: " + f.getKey() + ": " + err.getMessage());
                    });
                    e.getPickle().ifPresent(p -> out.add(toScenario(f.getKey(), p)));
                });
            }
        }
        return out;
    }

    /** Every {@code features/**.feature} of the TCK jar, sorted by path. */
    private static Map<String, byte[]> featureFiles() {
        URL anchor = TckScenarios.class.getClassLoader().getResource("features/");
        if (anchor == null) {
            throw new IllegalStateException("the openCypher TCK jar (org.opencypher:tck) is not on the test classpath");
        }
        Map<String, byte[]> files = new java.util.TreeMap<>();
        try {
            if (anchor.getProtocol().equals("jar")) {
                JarURLConnection conn = (JarURLConnection) anchor.openConnection();
                conn.setUseCaches(false);
                try (JarFile jar = conn.getJarFile()) {
                    for (JarEntry entry : Collections.list(jar.entries())) {
                        if (entry.getName().startsWith("features/") && entry.getName().endsWith(".feature")) {
                            try (InputStream in = jar.getInputStream(entry)) {
                                files.put(entry.getName(), in.readAllBytes());
                            }
                        }
                    }
                }
            } else {
                Path root = Paths.get(anchor.toURI());
                try (Stream<Path> walk = Files.walk(root)) {
                    for (Path p : walk.filter(p -> p.toString().endsWith(".feature"))
                            .sorted(Comparator.naturalOrder()).toList()) {
                        files.put("features/" + root.relativize(p).toString().replace('\\', '/'), Files.readAllBytes(p));
                    }
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
        return files;
    }

    private static final Pattern ERROR_STEP = Pattern.compile(
            "an? (\\w+) should be raised at (compile time|runtime|any time): (\\w+)");
    private static final Pattern NAMED_GRAPH = Pattern.compile("the ([\\w-]+) graph");

    private static Scenario toScenario(String feature, Pickle p) {
        GraphKind graph = GraphKind.ANY;
        Optional<String> graphName = Optional.empty();
        List<String> setup = new ArrayList<>();
        Map<String, String> params = new LinkedHashMap<>();
        List<Procedure> procedures = new ArrayList<>();
        Optional<String> query = Optional.empty();
        List<String> control = new ArrayList<>();
        Outcome outcome = Outcome.NONE;
        Optional<Table> table = Optional.empty();
        Optional<ExpectedError> error = Optional.empty();
        Map<String, Integer> effects = new LinkedHashMap<>();
        boolean effectsStated = false;

        for (PickleStep step : p.getSteps()) {
            String text = step.getText().trim();
            Optional<String> doc = step.getArgument().flatMap(a -> a.getDocString()).map(d -> d.getContent());
            List<List<String>> rows = step.getArgument().flatMap(a -> a.getDataTable()).map(TckScenarios::rows)
                    .orElse(List.of());
            Matcher m;
            if (text.equals("an empty graph")) {
                graph = GraphKind.EMPTY;
            } else if (text.equals("any graph")) {
                graph = GraphKind.ANY;
            } else if ((m = NAMED_GRAPH.matcher(text)).matches()) {
                graph = GraphKind.NAMED;
                graphName = Optional.of(m.group(1));
            } else if (text.equals("having executed:")) {
                doc.ifPresent(setup::add);
            } else if (text.equals("parameters are:")) {
                for (List<String> r : rows) params.put(r.get(0), r.size() > 1 ? r.get(1) : "");
            } else if (text.startsWith("there exists a procedure")) {
                procedures.add(new Procedure(text.substring("there exists a procedure".length()).trim()
                        .replaceAll(":$", ""), rows));
            } else if (text.equals("executing query:")) {
                query = doc;
            } else if (text.equals("executing control query:")) {
                doc.ifPresent(control::add);
            } else if (text.startsWith("the result should be empty")) {
                if (query.isPresent() && control.isEmpty()) {
                    outcome = Outcome.RESULT;
                    table = Optional.of(new Table(List.of(), List.of(), false, false));
                }
            } else if (text.startsWith("the result should be")) {
                if (control.isEmpty()) {
                    outcome = Outcome.RESULT;
                    List<String> header = rows.isEmpty() ? List.of() : rows.get(0);
                    table = Optional.of(new Table(header, rows.isEmpty() ? List.of() : rows.subList(1, rows.size()),
                            text.contains("in order"), text.contains("ignoring element order for lists")));
                }
            } else if ((m = ERROR_STEP.matcher(text)).find()) {
                outcome = Outcome.ERROR;
                error = Optional.of(new ExpectedError(m.group(1), m.group(2), m.group(3)));
            } else if (text.equals("no side effects")) {
                effectsStated = true;
            } else if (text.startsWith("the side effects should be")) {
                effectsStated = true;
                for (List<String> r : rows) effects.put(r.get(0), Integer.parseInt(r.get(1).trim()));
            }
        }
        int line = p.getLocation().map(l -> l.getLine().intValue()).orElse(0);
        return new Scenario(feature, p.getName(), line, p.getTags().stream().map(t -> t.getName()).toList(), graph,
                graphName, List.copyOf(setup), Collections.unmodifiableMap(params), List.copyOf(procedures), query,
                List.copyOf(control), outcome, table, error, Collections.unmodifiableMap(effects), effectsStated);
    }

    private static List<List<String>> rows(PickleTable t) {
        List<List<String>> out = new ArrayList<>();
        for (PickleTableRow r : t.getRows()) {
            out.add(r.getCells().stream().map(c -> c.getValue()).toList());
        }
        return out;
    }

}
