package dev.termgate.engine;

import org.apache.tinkerpop.gremlin.process.traversal.Bytecode;
import org.apache.tinkerpop.gremlin.process.traversal.P;
import org.apache.tinkerpop.gremlin.process.traversal.Traversal;
import org.apache.tinkerpop.gremlin.process.traversal.util.AndP;
import org.apache.tinkerpop.gremlin.process.traversal.util.OrP;

import java.util.Collection;
import java.util.StringJoiner;

/** Renders traversal bytecode as readable Gremlin text for {@code --explain} (never sent anywhere). */
final class GremlinText {
    private GremlinText() {}

    static String of(Traversal<?, ?> t) {
        return render(t.asAdmin().getBytecode(), "g");
    }

    private static String render(Bytecode b, String prefix) {
        StringBuilder sb = new StringBuilder(prefix);
        for (Bytecode.Instruction i : b.getStepInstructions()) {
            sb.append('.').append(i.getOperator()).append('(');
            StringJoiner args = new StringJoiner(", ");
            for (Object a : i.getArguments()) args.add(arg(a));
            sb.append(args).append(')');
        }
        return sb.toString();
    }

    private static String arg(Object a) {
        if (a instanceof Bytecode b) return render(b, "__");
        if (a instanceof Traversal<?, ?> t) return render(t.asAdmin().getBytecode(), "__");
        if (a instanceof String s) return s.startsWith("$") ? s : "'" + s.replace("'", "\\'") + "'";
        if (a instanceof AndP<?> p) return join(p.getPredicates(), "and");
        if (a instanceof OrP<?> p) return join(p.getPredicates(), "or");
        if (a instanceof P<?> p) return p.getBiPredicate().toString() + "(" + arg(p.getValue()) + ")";
        if (a instanceof Collection<?> c) {
            StringJoiner j = new StringJoiner(", ", "[", "]");
            for (Object o : c) j.add(arg(o));
            return j.toString();
        }
        if (a instanceof Long l) return l + "L";
        if (a instanceof Enum<?> e) return e.getDeclaringClass().getSimpleName() + "." + e.name();
        return String.valueOf(a);
    }

    private static String join(java.util.List<? extends P<?>> ps, String op) {
        StringJoiner j = new StringJoiner("." + op + "(", "", ")".repeat(Math.max(0, ps.size() - 1)));
        for (P<?> p : ps) j.add(arg(p));
        return j.toString();
    }
}
