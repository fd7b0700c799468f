package dev.termgate.translate;

import com.google.gson.JsonArray;
import com.google.gson.JsonElement;
import com.google.gson.JsonObject;
import com.google.gson.JsonPrimitive;
import dev.termgate.diag.Diagnostic;
import dev.termgate.engine.Engine;
import dev.termgate.engine.EngineException;
import dev.termgate.engine.Limits;
import dev.termgate.engine.Request;
import dev.termgate.engine.Result;
import dev.termgate.engine.ResultFormat;
import dev.termgate.engine.RunControl;
import dev.termgate.query.Span;
import dev.termgate.schema.GraphSchema;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** Runs accepted queries on the engine (embedded or remote); a thread interrupt (Ctrl-C in the shell) cancels the run. */
final class EngineRunner implements QueryRunner {

    private final Engine engine;
    private final GraphSchema schema;

    EngineRunner(Engine engine, GraphSchema schema) {
        this.engine = engine;
        this.schema = schema;
    }

    @Override
    public RunResult run(Checked checked, RunLimits limits) throws InterruptedException {
        if (!checked.valid() || checked.tree().isEmpty()) throw new IllegalStateException("only a query the gate accepted is run");
        Limits l = Limits.defaults().withTimeout(limits.timeout()).withMaxRows(limits.maxRows());
        Request req = new Request(checked.tree().get(), checked.query(), schema, Map.of(), l);
        RunControl control = RunControl.of(l);
        Thread caller = Thread.currentThread();
        try {
            Result r = engine.run(req, control);
            if (caller.isInterrupted()) throw new InterruptedException();
            return new RunResult(r.columns(), plainRows(r), r.truncated(), () -> plan(r, req), List.of());
        } catch (EngineException e) {
            if (Thread.interrupted()) throw new InterruptedException();
            return new RunResult(List.of(), List.of(), false, "", List.of(Diagnostic.at(e.code(), Span.NONE, e.getMessage())
                    .withSuggestions(List.of())));
        }
    }

    /** The plan that ran; the engine leaves it out of a result when running did not need one written down. */
    private String plan(Result r, Request req) {
        if (r.plan() != null) return r.plan().render();
        try {
            return engine.explain(req).render();
        } catch (RuntimeException e) {
            return "";
        }
    }

    /** The engine's values (nodes, relationships, temporal values) as plain values, through its JSON form. */
    private static List<List<Object>> plainRows(Result r) {
        JsonObject o = ResultFormat.json(r);
        List<List<Object>> rows = new ArrayList<>();
        for (JsonElement row : o.getAsJsonArray("rows")) {
            List<Object> x = new ArrayList<>();
            for (JsonElement v : row.getAsJsonArray()) x.add(plain(v));
            rows.add(x);
        }
        return rows;
    }

    static Object plain(JsonElement v) {
        if (v == null || v.isJsonNull()) return null;
        if (v instanceof JsonPrimitive p) {
            if (p.isBoolean()) return p.getAsBoolean();
            if (p.isNumber()) {
                String s = p.getAsString();
                return s.contains(".") || s.contains("e") || s.contains("E") ? (Object) p.getAsDouble() : (Object) p.getAsLong();
            }
            return p.getAsString();
        }
        if (v instanceof JsonArray a) {
            List<Object> l = new ArrayList<>();
            a.forEach(e -> l.add(plain(e)));
            return l;
        }
        Map<String, Object> m = new LinkedHashMap<>();
        v.getAsJsonObject().entrySet().forEach(e -> m.put(e.getKey(), plain(e.getValue())));
        return m;
    }
}
