package dev.termgate.cli;

import dev.termgate.diag.Code;
import dev.termgate.engine.Engine;
import dev.termgate.engine.EngineException;
import dev.termgate.engine.Engines;
import dev.termgate.engine.GraphFiles;
import dev.termgate.engine.Limits;
import dev.termgate.engine.Request;
import dev.termgate.engine.Result;
import dev.termgate.engine.ResultFormat;
import dev.termgate.engine.RunControl;
import dev.termgate.graph.ImportException;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.query.Query;
import dev.termgate.repair.CheckResult;
import dev.termgate.repair.QueryCheck;
import dev.termgate.schema.GraphSchema;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;

/** {@code termgate run}: check and run queries on the demo graph, a graph file or a Gremlin Server. */
@Command(name = "run", mixinStandardHelpOptions = true,
        description = "Check a read-only openCypher query and run it on the demo graph, --graph FILE or --remote URL.")
public final class RunCommand implements Callable<Integer> {

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Mixin
    OntologyOptions ontology;

    @Parameters(arity = "0..1", paramLabel = "QUERY", description = "the query (or use --file)")
    String query;

    @Option(names = "--file", paramLabel = "FILE", description = "read queries from FILE (- for standard input), separated by blank lines")
    String file;

    @Option(names = "--graph", paramLabel = "FILE", description = "graph to run on (repeatable): .tgraph (from import), .graphml, .cypher, .csv files or a directory of them, RDF data; default: the demo graph")
    List<Path> graph = new ArrayList<>();

    @Option(names = "--remote", paramLabel = "URL", description = "run on a Gremlin Server, e.g. ws://HOST:8182/gremlin")
    String remote;

    @Option(names = "--traversal-source", paramLabel = "NAME", defaultValue = "g", description = "the server's traversal source (default: ${DEFAULT-VALUE})")
    String traversalSource;

    @Option(names = "--schema-free", description = "use no ontology: every label, type and property is accepted and matched as written")
    boolean schemaFree;

    @Option(names = "--format", paramLabel = "table|json|csv", defaultValue = "table", description = "output format (default: ${DEFAULT-VALUE})")
    String format;

    @Option(names = "--timeout", paramLabel = "SECONDS", defaultValue = "30", description = "time limit of each query (default: ${DEFAULT-VALUE})")
    double timeout;

    @Option(names = "--max-rows", paramLabel = "N", defaultValue = "1000", description = "row cap of each query (default: ${DEFAULT-VALUE}); more rows are cut and marked truncated")
    int maxRows;

    @Option(names = "--explain", description = "print the plan (Gremlin traversals and client-side steps) before the rows")
    boolean explain;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        String fmt = format.toLowerCase(Locale.ROOT);
        if (!List.of("table", "json", "csv").contains(fmt)) throw new UserError(Exit.USAGE, "--format must be table, json or csv");
        if (!(timeout > 0)) throw new UserError(Exit.USAGE, "--timeout must be positive");
        if (maxRows < 1) throw new UserError(Exit.USAGE, "--max-rows must be at least 1");
        if (!graph.isEmpty() && remote != null) throw new UserError(Exit.USAGE, "give either --graph or --remote, not both");
        if (schemaFree && !ontology.sources().isEmpty()) throw new UserError(Exit.USAGE, "give either --ontology or --schema-free, not both");
        List<String> texts = queries();
        Limits limits = new Limits(Duration.ofMillis(Math.round(timeout * 1000)), maxRows, Limits.DEFAULT_MAX_INTERMEDIATE);

        GraphSchema schema = schemaFree ? GraphSchema.empty() : ontology.schema(err);
        // Check everything first (parser, analyzer, certain repairs): nothing invalid is run, and an invalid
        // query is reported before any graph is opened.
        List<Query> trees = new ArrayList<>();
        List<String> runTexts = new ArrayList<>();
        boolean invalid = false;
        CypherParser parser = new CypherParser();
        for (String t : texts) {
            CheckResult c = QueryCheck.check(t, schemaFree ? null : schema, QueryCheck.Mode.REPAIR);
            if (!c.valid()) {
                err.print(c.report());
                err.flush();
                invalid = true;
                trees.add(null);
                runTexts.add(t);
                continue;
            }
            String text = t;
            Query tree = c.runnableTree().orElseThrow();
            if (c.wasRepaired() && c.repaired().isPresent()) {
                err.print(c.report());
                err.flush();
                // Re-read the repaired text so that column names follow what is shown.
                ParseResult again = parser.parse(c.repaired().get());
                if (again.isValid()) {
                    text = c.repaired().get();
                    tree = again.tree();
                }
            }
            trees.add(tree);
            runTexts.add(text);
        }
        if (invalid && texts.size() == 1) return Exit.INVALID;

        int exit = invalid ? Exit.INVALID : Exit.OK;
        try (Engine engine = open(schema, err)) {
            for (int i = 0; i < texts.size(); i++) {
                if (trees.get(i) == null) continue;
                Request req = new Request(trees.get(i), runTexts.get(i), schema, java.util.Map.of(), limits);
                if (texts.size() > 1 && fmt.equals("table")) out.println("-- " + texts.get(i).strip().replace('\n', ' '));
                if (explain) out.print(engine.explain(req).render());
                RunControl control = RunControl.of(limits);
                Result result;
                try {
                    result = engine.run(req, control);
                } catch (EngineException e) {
                    err.println("termgate: " + e.code().id() + ": " + e.getMessage());
                    if (e.isServiceFailure()) return Exit.SERVICE;
                    exit = Exit.INVALID;
                    continue;
                }
                print(result, fmt, out, err);
            }
        }
        return exit;
    }

    private void print(Result r, String fmt, PrintWriter out, PrintWriter err) {
        switch (fmt) {
            case "json" -> out.println(ResultFormat.jsonText(r));
            case "csv" -> {
                out.print(ResultFormat.csv(r));
                if (r.truncated()) err.println("termgate: " + Code.ROW_LIMIT.id() + ": " + Code.ROW_LIMIT.format(r.rows().size()) + " (raise --max-rows)");
            }
            default -> out.print(ResultFormat.table(r));
        }
        out.flush();
    }

    private Engine open(GraphSchema schema, PrintWriter err) {
        try {
            if (remote != null) return Engines.remote(remote, traversalSource, Duration.ofSeconds(10));
            GraphFiles.Loaded loaded = graph.isEmpty()
                    ? GraphFiles.demo(schemaFree ? ontology.schema(err) : schema)
                    : GraphFiles.open(graph, schema);
            loaded.problems().forEach(d -> err.println("termgate: " + d.severity().word() + " " + d.code().id() + ": " + d.fullMessage()));
            return loaded.engine();
        } catch (EngineException e) {
            throw new UserError(e.isServiceFailure() ? Exit.SERVICE : Exit.INVALID, e.getMessage());
        } catch (ImportException e) {
            throw new UserError(Exit.INVALID, e.getMessage());
        }
    }

    private List<String> queries() {
        if (query != null && file != null) throw new UserError(Exit.USAGE, "give either a QUERY or --file, not both");
        if (query != null) return List.of(query);
        if (file == null) throw new UserError(Exit.USAGE, "give a QUERY or --file FILE");
        String text;
        try {
            text = file.equals("-") ? new String(System.in.readAllBytes(), StandardCharsets.UTF_8)
                    : Files.readString(Path.of(file), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UserError(Exit.USAGE, "cannot read " + file + ": " + e.getMessage());
        }
        List<String> qs = dev.termgate.parser.QueryFile.split(text).stream().map(dev.termgate.parser.QueryFile.Entry::text).toList();
        if (qs.isEmpty()) throw new UserError(Exit.INVALID, file + " holds no query");
        return qs;
    }
}
