package dev.termgate.cli;

import dev.termgate.diag.Code;
import dev.termgate.engine.Engine;
import dev.termgate.engine.EngineException;
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
import dev.termgate.translate.GraphSource;
import dev.termgate.translate.PipelineSpec;
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

    @Mixin
    GraphOptions graph;

    @Parameters(arity = "0..1", paramLabel = "QUERY", description = "the query (or use --file)")
    String query;

    @Option(names = "--file", paramLabel = "FILE", description = "read queries from FILE (- for standard input), separated by blank lines")
    String file;

    @Option(names = "--format", paramLabel = "table|json|csv", defaultValue = "table", description = "output format (default: ${DEFAULT-VALUE})")
    String format;

    @Option(names = "--explain", description = "print the plan (Gremlin traversals and client-side steps) before the rows")
    boolean explain;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        String fmt = format.toLowerCase(Locale.ROOT);
        if (!List.of("table", "json", "csv").contains(fmt)) throw new UserError(Exit.USAGE, "--format must be table, json or csv");
        List<String> texts = queries();
        Limits limits = graph.engineLimits();
        PipelineSpec source = graph.spec(ontology, PipelineSpec.DEFAULT_BUDGET, err);
        GraphSchema schema = source.schema();
        boolean schemaFree = source.schemaFree();
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
        try (Engine engine = open(source)) {
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

    private static Engine open(PipelineSpec source) {
        try {
            return GraphSource.open(source);
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
