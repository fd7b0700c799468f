package dev.termgate.engine;

import dev.termgate.graph.GraphBuilder;
import dev.termgate.graph.ImportException;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.query.Clause;
import dev.termgate.query.Expr;
import dev.termgate.query.LabelExpr;
import dev.termgate.query.Pattern;
import dev.termgate.query.Query;
import dev.termgate.schema.GraphSchema;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.time.Duration;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Imports a script of openCypher statements separated by semicolons ({@code .cypher} files, the usual way
 * small graphs are shared). Only CREATE writes, together with the read clauses that feed it (MATCH, UNWIND,
 * WITH); the importer owns this write path — the query engine never runs a write clause.
 */
public final class CypherScript {
    private CypherScript() {}

    /** Runs every statement of the script into the builder's graph. */
    public static void load(String script, GraphBuilder builder, Map<String, Object> params) {
        List<String> statements = split(script);
        CypherParser parser = new CypherParser(Integer.MAX_VALUE, 1000);
        for (int i = 0; i < statements.size(); i++) {
            String text = statements.get(i);
            ParseResult r = parser.parse(text);
            if (!r.isValid()) {
                throw new ImportException("statement " + (i + 1) + " does not parse:\n" + r.render());
            }
            run(r.tree(), text, builder, params);
        }
    }

    /** Runs one parsed statement (read clauses plus CREATE). */
    public static void run(Query q, String text, GraphBuilder builder, Map<String, Object> params) {
        for (var sq : q.parts()) {
            for (Clause c : sq.clauses()) {
                if (c.isWrite() && !(c instanceof Clause.Create)) {
                    throw new ImportException("only CREATE statements can be imported; found "
                            + c.getClass().getSimpleName().toUpperCase(java.util.Locale.ROOT));
                }
            }
        }
        TinkerGraph g = builder.graph();
        GraphPort port = new GraphPort(g.traversal(), "import", g);
        RunControl control = RunControl.of(Limits.unlimitedRows(Duration.ofMinutes(10)));
        Executor ex = new Executor(port, GraphSchema.empty(), control, params, TraversalEngine.namer(text),
                (clause, rows, self) -> create((Clause.Create) clause, rows, self, builder));
        try {
            ex.run(q, List.of(Row.EMPTY));
        } catch (EngineException e) {
            throw new ImportException(e.getMessage(), e);
        }
    }

    private static List<Row> create(Clause.Create c, List<Row> rows, Executor ex, GraphBuilder builder) {
        List<Row> out = new ArrayList<>(rows.size());
        for (Row row : rows) {
            Row r = row;
            for (Pattern.Part part : c.pattern().parts()) r = createPart(part, r, ex, builder);
            out.add(r);
        }
        ex.port().invalidate();
        return out;
    }

    private static Row createPart(Pattern.Part part, Row row, Executor ex, GraphBuilder builder) {
        List<NodeValue> nodes = new ArrayList<>();
        List<RelValue> rels = new ArrayList<>();
        NodeValue prev = node(part.start(), row, ex, builder);
        row = bind(row, part.start().variable(), prev);
        nodes.add(prev);
        for (Pattern.Step s : part.steps()) {
            NodeValue next = node(s.node(), row, ex, builder);
            row = bind(row, s.node().variable(), next);
            Pattern.RelPattern rp = s.rel();
            if (rp.types().isEmpty() || !(rp.types().get() instanceof LabelExpr.Name type)) {
                throw new ImportException("CREATE needs exactly one relationship type");
            }
            Map<String, Object> props = props(rp.properties(), row, ex);
            boolean forward = rp.direction() != Pattern.Direction.INCOMING;
            NodeValue from = forward ? prev : next, to = forward ? next : prev;
            Object id = builder.addRelationship(from.id(), to.id(), type.name(), props);
            RelValue rel = new RelValue(id, type.name(), from.id(), to.id(), props);
            row = bind(row, rp.variable(), rel);
            rels.add(rel);
            nodes.add(next);
            prev = next;
        }
        if (part.pathVariable().isPresent()) row = row.with(part.pathVariable().get().name(), new PathValue(nodes, rels));
        return row;
    }

    private static Row bind(Row row, java.util.Optional<Expr.Variable> var, Object value) {
        return var.isPresent() && !row.has(var.get().name()) ? row.with(var.get().name(), value) : row;
    }

    private static NodeValue node(Pattern.NodePattern np, Row row, Executor ex, GraphBuilder builder) {
        if (np.variable().isPresent() && row.has(np.variable().get().name())) {
            Object v = row.get(np.variable().get().name());
            if (v instanceof NodeValue n) return n;
            throw new ImportException("variable '" + np.variable().get().name() + "' is not a node");
        }
        List<String> labels = new ArrayList<>();
        np.labels().ifPresent(l -> collectLabels(l, labels));
        Map<String, Object> props = props(np.properties(), row, ex);
        Object id = builder.addNode(labels, props);
        return new NodeValue(id, labels, props);
    }

    private static void collectLabels(LabelExpr l, List<String> out) {
        if (l instanceof LabelExpr.Name n) out.add(n.name());
        else if (l instanceof LabelExpr.And a) a.operands().forEach(o -> collectLabels(o, out));
        else throw new ImportException("CREATE takes plain labels only");
    }

    private static Map<String, Object> props(java.util.Optional<Expr> e, Row row, Executor ex) {
        Map<String, Object> out = new LinkedHashMap<>();
        if (e.isEmpty()) return out;
        Object v = ex.ev.eval(e.get(), row);
        if (!(v instanceof Map<?, ?> m)) throw new ImportException("properties must be a map");
        m.forEach((k, x) -> {
            if (x != null) out.put(String.valueOf(k), x);
        });
        return out;
    }

    /** Splits on semicolons outside strings, backtick names and comments. */
    static List<String> split(String script) {
        List<String> out = new ArrayList<>();
        StringBuilder cur = new StringBuilder();
        int n = script.length();
        for (int i = 0; i < n; i++) {
            char c = script.charAt(i);
            if (c == '\'' || c == '"' || c == '`') {
                int j = i + 1;
                while (j < n && script.charAt(j) != c) {
                    if (script.charAt(j) == '\\' && c != '`') j++;
                    j++;
                }
                cur.append(script, i, Math.min(n, j + 1));
                i = j;
            } else if (c == '/' && i + 1 < n && script.charAt(i + 1) == '/') {
                int j = script.indexOf('\n', i);
                if (j < 0) j = n;
                i = j - 1;
            } else if (c == '/' && i + 1 < n && script.charAt(i + 1) == '*') {
                int j = script.indexOf("*/", i + 2);
                i = j < 0 ? n : j + 1;
            } else if (c == ';') {
                if (!cur.toString().isBlank()) out.add(cur.toString().strip());
                cur.setLength(0);
            } else {
                cur.append(c);
            }
        }
        if (!cur.toString().isBlank()) out.add(cur.toString().strip());
        return out;
    }
}
