package dev.termgate.cli;

import dev.termgate.audit.AuditInput;
import dev.termgate.audit.AuditReport;
import dev.termgate.eval.HtmlReport;
import dev.termgate.ontology.OntologyException;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.schema.GraphSchema;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.PipelineSpec;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;

/** {@code termgate audit FILE.jsonl} or {@code --queries FILE}: which ontology terms the queries used. */
@Command(name = "audit", mixinStandardHelpOptions = true,
        description = {"Report the ontology terms used by the queries of a batch output file, or of a file of queries",
                "(separated by blank lines): usage counts, terms never used, deprecated terms, terms used outside the card."},
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {
                "0:the audit ran",
                "1:the file is malformed or from another format version (the message says which)",
                "2:usage error (no input, unreadable file, unwritable report)",
                "4:internal error"})
public final class AuditCommand implements Callable<Integer> {

    @Parameters(index = "0", arity = "0..1", paramLabel = "FILE.jsonl", description = "a batch output file")
    Path batchFile;

    @Option(names = "--queries", paramLabel = "FILE", description = "openCypher queries separated by blank lines")
    Path queries;

    @Option(names = "--format", paramLabel = "table|json", defaultValue = "table", description = "output: table (default) or json")
    String format;

    @Option(names = "--html", paramLabel = "FILE", description = "also write the coverage view as a self-contained HTML page")
    Path html;

    @Mixin OntologyOptions ontology;
    @Mixin GraphOptions graph;

    @Spec picocli.CommandLine.Model.CommandSpec spec;

    private final Pipeline.Factory factory;

    public AuditCommand() {
        this(AskWiring.standard());
    }

    AuditCommand(Pipeline.Factory factory) {
        this.factory = factory;
    }

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (!format.equals("table") && !format.equals("json")) throw new UserError(Exit.USAGE, "--format takes table or json");
        if ((batchFile == null) == (queries == null)) {
            throw new UserError(Exit.USAGE, "give either a batch output FILE.jsonl or --queries FILE");
        }
        Path file = batchFile != null ? batchFile : queries;
        if (!Files.isRegularFile(file)) throw new UserError(Exit.USAGE, "cannot read " + file + ": no such file");
        AuditInput.Read read;
        GraphSchema schema;
        Pipeline pipeline = null;
        try {
            if (batchFile != null) {
                read = AuditInput.batch(batchFile);
                schema = schema();
            } else {
                pipeline = AskWiring.open(factory, graph.spec(ontology, PipelineSpec.DEFAULT_BUDGET, err));
                read = AuditInput.queries(queries, pipeline.gate());
                schema = pipeline.schema();
            }
        } catch (java.nio.charset.MalformedInputException e) {
            throw new UserError(Exit.INVALID, file + " is not UTF-8 text");
        } catch (IOException e) {
            throw new UserError(Exit.USAGE, "cannot read " + file + ": " + e.getMessage());
        } catch (AuditInput.Invalid e) {
            throw new UserError(Exit.INVALID, e.getMessage());
        } finally {
            if (pipeline != null) AskWiring.closeQuietly(pipeline);
        }
        read.notices().forEach(n -> err.println("termgate: " + n));
        AuditReport report = new AuditReport(read.entries(), schema);
        if (html != null) EvalCommand.write(html, HtmlReport.audit(report));
        out.print(format.equals("json") ? report.json() + "\n" : report.table());
        out.flush();
        return Exit.OK;
    }

    /** The ontology of the audit: --ontology files, the demo ontology by default, none with --schema-free. */
    private GraphSchema schema() {
        if (graph.schemaFree) return GraphSchema.empty();
        return ontology.schema(spec.commandLine().getErr());
    }
}
