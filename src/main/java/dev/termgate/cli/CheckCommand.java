package dev.termgate.cli;

import com.google.gson.Gson;
import com.google.gson.GsonBuilder;
import com.google.gson.JsonObject;
import dev.termgate.engine.Engine;
import dev.termgate.engine.EngineException;
import dev.termgate.graph.ImportException;
import dev.termgate.translate.GraphSource;
import dev.termgate.translate.PipelineSpec;
import dev.termgate.engine.Limits;
import dev.termgate.engine.Request;
import dev.termgate.parser.QueryFile;
import dev.termgate.repair.CheckJson;
import dev.termgate.repair.CheckResult;
import dev.termgate.repair.CheckText;
import dev.termgate.repair.QueryCheck;
import dev.termgate.schema.GraphSchema;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

import java.io.IOException;
import java.io.InputStream;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;

/**
 * {@code termgate check}: reads queries, checks each one (syntax, scope and types, and with an ontology every term,
 * direction and class), prints its canonical form or its diagnostics, the certain repair when there is one, and
 * the ontology terms it uses. Wiring only: the work is {@link QueryCheck}.
 */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = {"Check openCypher queries: syntax, scope and types, and every label, relationship type,",
                "property key, direction and class against the ontology (the demo ontology unless --ontology or",
                "--schema-free is given). Shows the certain repair when there is one, and the terms used."},
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {"0:every query is valid (possibly after a certain repair, which is shown)",
                "1:at least one query is invalid, or the ontology is", "2:usage error",
                "3:the ontology could not be fetched", "4:internal error"})
public final class CheckCommand implements Callable<Integer> {

    enum Format { text, json }

    @Spec
    CommandSpec spec;

    @Parameters(arity = "0..1", paramLabel = "QUERY", description = "The query to check.")
    String query;

    @Option(names = "--file", paramLabel = "FILE",
            description = "Read queries from FILE ('-' for standard input); queries are separated by blank lines.")
    String file;

    @Option(names = "--schema-free", description = "Check without an ontology (syntax, scope and types only).")
    boolean schemaFree;

    @Option(names = "--no-repair", description = "Report only; do not apply certain repairs.")
    boolean noRepair;

    @Option(names = "--explain", description = "Also show the plan of each valid query on the graph (the demo graph unless --graph):"
            + " the Gremlin traversals and the client-side steps.")
    boolean explain;

    @Option(names = "--graph", paramLabel = "FILE", description = "With --explain: the graph the plan is made for (repeatable; as for run).")
    List<Path> graphs = new ArrayList<>();

    @Option(names = "--format", paramLabel = "FORMAT", defaultValue = "text",
            description = "text (default) or json: one JSON object per query, in input order.")
    Format format;

    @Mixin
    OntologyOptions ontology;

    @Override
    public Integer call() throws IOException {
        if ((query == null) == (file == null)) {
            throw new UserError(Exit.USAGE, "give either a QUERY or --file FILE");
        }
        if (schemaFree && !ontology.sources().isEmpty()) {
            throw new UserError(Exit.USAGE, "--schema-free and --ontology exclude each other");
        }
        List<QueryFile.Entry> entries = query != null ? List.of(new QueryFile.Entry(0, 1, query))
                : QueryFile.split(readInput(file));
        PrintWriter out = spec.commandLine().getOut();
        GraphSchema schema = schemaFree ? null : ontology.schema(spec.commandLine().getErr());
        QueryCheck.Mode mode = noRepair ? QueryCheck.Mode.CHECK_ONLY : QueryCheck.Mode.REPAIR;
        boolean allValid = true;
        Gson gson = new GsonBuilder().serializeNulls().disableHtmlEscaping().create();
        if (!graphs.isEmpty() && !explain) throw new UserError(Exit.USAGE, "--graph goes with --explain");
        try (Engine planner = explain ? planner(schema) : null) {
            for (QueryFile.Entry entry : entries) {
                CheckResult c = QueryCheck.check(entry.text(), schema, mode);
                allValid &= c.valid();
                String plan = explain ? plan(planner, c, schema) : null;
                if (format == Format.json) {
                    JsonObject o = new JsonObject();
                    o.addProperty("index", entry.index());
                    o.addProperty("line", entry.line());
                    CheckJson.of(c, entry.line() - 1).entrySet().forEach(e -> o.add(e.getKey(), e.getValue()));
                    if (explain) o.addProperty("plan", plan);
                    out.println(gson.toJson(o));
                } else {
                    if (entry.index() > 0) out.println();
                    if (file != null) out.println("// query " + (entry.index() + 1) + ", line " + entry.line());
                    out.print(CheckText.of(c));
                    if (plan != null) out.print("plan:\n" + plan.stripTrailing().indent(2));
                }
            }
        }
        out.flush();
        return allValid ? Exit.OK : Exit.INVALID;
    }

    /** The graph plans are made for: the engine compiles a plan from the query, the schema and what the graph stores. */
    private Engine planner(GraphSchema schema) {
        GraphSchema importSchema = schema != null ? schema : ontology.schema(spec.commandLine().getErr());
        try {
            return GraphSource.open(PipelineSpec.local(importSchema, graphs));
        } catch (EngineException | ImportException e) {
            throw new UserError(Exit.INVALID, e.getMessage());
        }
    }

    /** The plan the embedded engine would run, for a query that is valid (possibly after repair); null otherwise. */
    private static String plan(Engine planner, CheckResult c, GraphSchema schema) {
        return c.runnableTree().map(tree -> planner.explain(Request.of(tree, c.repaired().orElse(c.source()),
                schema == null ? GraphSchema.empty() : schema, Limits.defaults())).render()).orElse(null);
    }

    private static String readInput(String file) throws IOException {
        if (file.equals("-")) {
            InputStream in = System.in;
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
        try {
            return Files.readString(Path.of(file), StandardCharsets.UTF_8);
        } catch (NoSuchFileException e) {
            throw new UserError(Exit.USAGE, "no such file: " + file);
        } catch (java.nio.charset.MalformedInputException e) {
            throw new UserError(Exit.INVALID, file + " is not UTF-8 text");
        }
    }
}
