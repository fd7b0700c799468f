package dev.termgate.cli;

import com.google.gson.Gson;
import com.google.gson.GsonBuilder;
import com.google.gson.JsonObject;
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
        for (QueryFile.Entry entry : entries) {
            CheckResult c = QueryCheck.check(entry.text(), schema, mode);
            allValid &= c.valid();
            if (format == Format.json) {
                JsonObject o = new JsonObject();
                o.addProperty("index", entry.index());
                o.addProperty("line", entry.line());
                CheckJson.of(c, entry.line() - 1).entrySet().forEach(e -> o.add(e.getKey(), e.getValue()));
                out.println(gson.toJson(o));
            } else {
                if (entry.index() > 0) out.println();
                if (file != null) out.println("// query " + (entry.index() + 1) + ", line " + entry.line());
                out.print(CheckText.of(c));
            }
        }
        out.flush();
        return allValid ? Exit.OK : Exit.INVALID;
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
