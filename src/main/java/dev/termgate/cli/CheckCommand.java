package dev.termgate.cli;

import com.google.gson.Gson;
import com.google.gson.GsonBuilder;
import com.google.gson.JsonArray;
import com.google.gson.JsonObject;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Render;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.parser.QueryFile;
import dev.termgate.query.Printer;
import dev.termgate.query.Query;
import picocli.CommandLine.Command;
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

/** {@code termgate check}: reads queries, prints each one's canonical form or its diagnostics. Wiring only. */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = "Check openCypher queries: syntax now; scope and ontology terms with the analyzer.",
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {"0:every query is valid", "1:at least one query is invalid", "2:usage error"})
public final class CheckCommand implements Callable<Integer> {

    enum Format { text, json }

    @Spec
    CommandSpec spec;

    @Parameters(arity = "0..1", paramLabel = "QUERY", description = "The query to check.")
    String query;

    @Option(names = "--file", paramLabel = "FILE",
            description = "Read queries from FILE ('-' for standard input); queries are separated by blank lines.")
    String file;

    @Option(names = "--schema-free", description = "Check without an ontology.")
    boolean schemaFree;

    @Option(names = "--format", paramLabel = "FORMAT", defaultValue = "text",
            description = "text (default) or json: one JSON object per query, in input order.")
    Format format;

    private final CypherParser parser = new CypherParser();

    @Override
    public Integer call() throws IOException {
        if ((query == null) == (file == null)) {
            throw new UserError(Exit.USAGE, "give either a QUERY or --file FILE");
        }
        if (!schemaFree) {
            throw new UserError(Exit.USAGE, "give --schema-free to check without an ontology");
        }
        List<QueryFile.Entry> entries = query != null ? List.of(new QueryFile.Entry(0, 1, query))
                : QueryFile.split(readInput(file));
        PrintWriter out = spec.commandLine().getOut();
        boolean allValid = true;
        Gson gson = new GsonBuilder().serializeNulls().disableHtmlEscaping().create();
        for (QueryFile.Entry entry : entries) {
            Checked c = check(entry.text());
            allValid &= c.valid();
            if (format == Format.json) {
                out.println(gson.toJson(json(entry, c)));
            } else {
                if (entry.index() > 0) out.println();
                if (file != null) out.println("// query " + (entry.index() + 1) + ", line " + entry.line());
                out.print(c.valid() ? c.canonical() + "\n" : Render.all(entry.text(), c.diagnostics()));
            }
        }
        out.flush();
        return allValid ? Exit.OK : Exit.INVALID;
    }

    /** The outcome for one query; the analyzer's checks join the syntax check here. */
    record Checked(boolean valid, String canonical, List<Diagnostic> diagnostics) {}

    Checked check(String text) {
        ParseResult r = parser.parse(text);
        if (!r.isValid()) return new Checked(false, null, r.diagnostics());
        Query tree = r.tree();
        List<Diagnostic> found = new ArrayList<>();
        boolean valid = found.stream().noneMatch(Diagnostic::isError);
        return new Checked(valid, valid ? Printer.print(tree) : null, found);
    }

    /** Diagnostic lines count from the start of the file, so a reader can go straight to them. */
    private static JsonObject json(QueryFile.Entry entry, Checked c) {
        JsonObject o = new JsonObject();
        o.addProperty("index", entry.index());
        o.addProperty("line", entry.line());
        o.addProperty("valid", c.valid());
        o.addProperty("canonical", c.canonical());
        JsonArray ds = new JsonArray();
        for (Diagnostic d : c.diagnostics()) {
            JsonObject j = new JsonObject();
            j.addProperty("code", d.code().id());
            j.addProperty("severity", d.severity().word());
            j.addProperty("line", d.span().isNone() ? 0 : d.span().startLine() + entry.line() - 1);
            j.addProperty("column", d.span().isNone() ? 0 : d.span().startColumn());
            j.addProperty("message", d.fullMessage());
            ds.add(j);
        }
        o.add("diagnostics", ds);
        return o;
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
