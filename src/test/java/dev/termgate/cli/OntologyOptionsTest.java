package dev.termgate.cli;

import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.ServerSocket;
import java.util.List;
import java.util.concurrent.Callable;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The shared ontology options, through the real top command's exit-code mapping. */
class OntologyOptionsTest {

    @CommandLine.Command(name = "probe")
    static final class Probe implements Callable<Integer> {
        @CommandLine.Mixin
        OntologyOptions ontology;
        @CommandLine.Spec
        CommandLine.Model.CommandSpec spec;

        @Override
        public Integer call() {
            GraphSchema s = ontology.schema(spec.commandLine().getErr());
            spec.commandLine().getOut().println(s.labels().size() + " labels");
            return Exit.OK;
        }
    }

    record Run(int code, String out, String err) {}

    static Run run(String... args) {
        CommandLine cl = Main.commandLine();
        cl.addSubcommand("probe", new Probe());
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        return new Run(cl.execute(args), out.toString(), err.toString());
    }

    @Test
    void demoOntologyByDefault() {
        Run r = run("probe", "--no-cache");
        assertEquals(Exit.OK, r.code(), r.err());
        assertTrue(r.out().matches("\\d+ labels\\s*"), r.out());
    }

    @Test
    void warningsGoToStandardError() {
        Run r = run("probe", "--no-cache", "--ontology", "src/test/resources/ontology-cases/cycle.ttl");
        assertEquals(Exit.OK, r.code());
        assertEquals("4 labels", r.out().strip());
        assertTrue(r.err().contains("warning TG6005: classes 'Conveyance', 'Craft' and 'Vehicle' form a subclass cycle"), r.err());
    }

    @Test
    void manyWarningsAreCounted() {
        // schema.org gives 43 name collisions and 2 punned terms (see README, "Names").
        Run r = run("probe", "--ontology", "src/test/resources/ontologies/schema.nq");
        assertEquals(Exit.OK, r.code(), r.err());
        List<String> lines = r.err().lines().toList();
        assertEquals(OntologyOptions.MAX_WARNINGS + 1, lines.size(), r.err());
        assertEquals("termgate: … and 35 more ontology warnings",
                lines.get(lines.size() - 1));
    }

    @Test
    void invalidOntologyExitsWithOne() {
        Run r = run("probe", "--ontology", "src/test/resources/ontology-cases/syntax-error.ttl");
        assertEquals(Exit.INVALID, r.code());
        assertEquals("termgate: error TG6001: src/test/resources/ontology-cases/syntax-error.ttl, line 6, column 1:"
                + " Triples not terminated by DOT", r.err().strip());
    }

    @Test
    void unreachableSparqlEndpointExitsWithThree() throws IOException {
        int port;
        try (ServerSocket s = new ServerSocket(0)) {
            port = s.getLocalPort();
        }
        Run r = run("probe", "--sparql", "http://127.0.0.1:" + port + "/ds/sparql");
        assertEquals(Exit.SERVICE, r.code(), r.err());
        assertTrue(r.err().startsWith("termgate: error TG6002: cannot read the SPARQL endpoint http://127.0.0.1:" + port), r.err());
        assertTrue(!r.err().contains("\tat "), "no stack trace");
    }

    @Test
    void badNamingStyleIsAUsageError() {
        Run r = run("probe", "--naming", "camel");
        assertEquals(Exit.USAGE, r.code());
        assertTrue(r.err().contains("'camel' is not a naming style; use graph or as-is"), r.err());
    }

    @Test
    void asIsNaming() {
        Run r = run("probe", "--no-cache", "--naming", "as-is", "--ontology", "src/test/resources/ontology-cases/naming.ttl");
        assertEquals(Exit.OK, r.code(), r.err());
        assertEquals("5 labels", r.out().strip());
    }
}
