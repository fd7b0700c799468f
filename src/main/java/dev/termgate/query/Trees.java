package dev.termgate.query;

import java.lang.reflect.Constructor;
import java.lang.reflect.InvocationTargetException;
import java.lang.reflect.RecordComponent;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.Consumer;
import java.util.function.Function;

/**
 * Generic operations over the record tree, so that walking, comparing and rewriting do not need one
 * method per node kind. Works by reading record components; every component is a node, an
 * {@code Optional} or {@code List} of nodes, or a plain value.
 */
public final class Trees {

    private static final Map<Class<?>, RecordComponent[]> COMPONENTS = new ConcurrentHashMap<>();
    private static final Map<Class<?>, Constructor<?>> CONSTRUCTORS = new ConcurrentHashMap<>();

    private Trees() {}

    /** The direct child nodes, in component order. */
    public static List<Node> children(Node node) {
        List<Node> out = new ArrayList<>();
        for (RecordComponent c : components(node.getClass())) {
            collectNodes(read(c, node), out);
        }
        return out;
    }

    /** Visits the node and all its descendants, parents first. */
    public static void walk(Node node, Consumer<Node> visitor) {
        // An explicit stack: trees from deeply nested input must not overflow the Java stack.
        var stack = new ArrayList<Node>();
        stack.add(node);
        while (!stack.isEmpty()) {
            Node n = stack.remove(stack.size() - 1);
            visitor.accept(n);
            List<Node> kids = children(n);
            for (int i = kids.size() - 1; i >= 0; i--) {
                stack.add(kids.get(i));
            }
        }
    }

    /** All descendants (and the node itself) of the given type, in pre-order. */
    public static <T extends Node> List<T> find(Node root, Class<T> type) {
        List<T> out = new ArrayList<>();
        walk(root, n -> {
            if (type.isInstance(n)) out.add(type.cast(n));
        });
        return out;
    }

    /** Structural equality that ignores every {@link Span}. */
    public static boolean equalIgnoringSpans(Node a, Node b) {
        return stripSpans(a).equals(stripSpans(b));
    }

    /** The same tree with every span set to {@link Span#NONE}. */
    @SuppressWarnings("unchecked")
    public static <T extends Node> T stripSpans(T node) {
        return (T) rebuild(node, n -> n, true);
    }

    /**
     * Rewrites bottom-up: children first, then {@code fn} is applied to the rebuilt node. Nodes that
     * {@code fn} returns unchanged (and whose children did not change) are kept as they are.
     */
    @SuppressWarnings("unchecked")
    public static <T extends Node> T rewrite(T root, Function<Node, Node> fn) {
        return (T) rebuild(root, fn, false);
    }

    private static Node rebuild(Node node, Function<Node, Node> fn, boolean dropSpans) {
        RecordComponent[] comps = components(node.getClass());
        Object[] args = new Object[comps.length];
        boolean changed = false;
        for (int i = 0; i < comps.length; i++) {
            Object old = read(comps[i], node);
            Object now = dropSpans && old instanceof Span ? Span.NONE : rebuildValue(old, fn, dropSpans);
            args[i] = now;
            changed |= now != old;
        }
        Node rebuilt = changed ? construct(node.getClass(), args) : node;
        return fn.apply(rebuilt);
    }

    private static Object rebuildValue(Object value, Function<Node, Node> fn, boolean dropSpans) {
        if (value instanceof Node n) {
            return rebuild(n, fn, dropSpans);
        }
        if (value instanceof Optional<?> opt && opt.isPresent() && opt.get() instanceof Node n) {
            Node r = rebuild(n, fn, dropSpans);
            return r == n ? value : Optional.of(r);
        }
        if (value instanceof List<?> list && !list.isEmpty() && list.get(0) instanceof Node) {
            List<Object> out = new ArrayList<>(list.size());
            boolean changed = false;
            for (Object o : list) {
                Object r = rebuild((Node) o, fn, dropSpans);
                changed |= r != o;
                out.add(r);
            }
            return changed ? List.copyOf(out) : value;
        }
        return value;
    }

    private static void collectNodes(Object value, List<Node> out) {
        if (value instanceof Node n) {
            out.add(n);
        } else if (value instanceof Optional<?> opt && opt.isPresent() && opt.get() instanceof Node n) {
            out.add(n);
        } else if (value instanceof Collection<?> list) {
            for (Object o : list) {
                if (o instanceof Node n) out.add(n);
            }
        }
    }

    private static RecordComponent[] components(Class<?> type) {
        return COMPONENTS.computeIfAbsent(type, Class::getRecordComponents);
    }

    private static Object read(RecordComponent c, Object target) {
        try {
            return c.getAccessor().invoke(target);
        } catch (IllegalAccessException | InvocationTargetException e) {
            throw new IllegalStateException("cannot read " + c, e);
        }
    }

    private static Node construct(Class<?> type, Object[] args) {
        Constructor<?> ctor = CONSTRUCTORS.computeIfAbsent(type, t -> {
            RecordComponent[] comps = components(t);
            Class<?>[] types = new Class<?>[comps.length];
            for (int i = 0; i < comps.length; i++) types[i] = comps[i].getType();
            try {
                return t.getDeclaredConstructor(types);
            } catch (NoSuchMethodException e) {
                throw new IllegalStateException(e);
            }
        });
        try {
            return (Node) ctor.newInstance(args);
        } catch (ReflectiveOperationException e) {
            throw new IllegalStateException("cannot rebuild " + type.getSimpleName(), e);
        }
    }
}
