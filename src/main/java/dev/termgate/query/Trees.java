package dev.termgate.query;

import java.lang.invoke.CallSite;
import java.lang.invoke.LambdaMetafactory;
import java.lang.invoke.MethodHandle;
import java.lang.invoke.MethodHandles;
import java.lang.invoke.MethodType;
import java.lang.reflect.RecordComponent;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Optional;
import java.util.function.Consumer;
import java.util.function.Function;

/**
 * Generic operations over the record tree, so that walking, comparing and rewriting do not need one
 * method per node kind. Works by reading record components; every component is a node, an
 * {@code Optional} or {@code List} of nodes, or a plain value.
 *
 * <p>Each record class gets a {@link Shape} on first use: plain-function getters made from its accessors (no
 * reflective call per read) and the indexes of the components that can hold nodes, so a walk skips spans,
 * names and numbers without looking at them. The analyzer walks every query, so this is on the hot path.
 */
public final class Trees {

    /** What a component may hold, decided once from its declared type. */
    private enum Slot { NODE, OPTIONAL, LIST, SPAN, PLAIN }

    /** The cached accessor table of one record class. */
    private static final class Shape {
        final Function<Object, Object>[] getters;
        final Slot[] slots;
        /** Indexes of the NODE, OPTIONAL and LIST components, in component order. */
        final int[] childSlots;
        final MethodHandle constructor;

        Shape(Function<Object, Object>[] getters, Slot[] slots, int[] childSlots, MethodHandle constructor) {
            this.getters = getters;
            this.slots = slots;
            this.childSlots = childSlots;
            this.constructor = constructor;
        }
    }

    private static final ClassValue<Shape> SHAPES = new ClassValue<>() {
        @Override
        protected Shape computeValue(Class<?> type) {
            return shapeOf(type);
        }
    };

    private Trees() {}

    /** The direct child nodes, in component order. */
    public static List<Node> children(Node node) {
        List<Node> out = new ArrayList<>(4);
        addChildren(node, out);
        return out;
    }

    /** Appends the direct child nodes of {@code node} to {@code out}, in component order. */
    private static void addChildren(Node node, List<Node> out) {
        Children.Kids<Node> kids = Children.of(node.getClass());
        if (kids != null) {
            kids.add(node, out);
            return;
        }
        genericChildren(node, out);
    }

    /** The children read through the accessor table: the reference {@link Children} is tested against. */
    static void genericChildren(Node node, List<Node> out) {
        Shape shape = SHAPES.get(node.getClass());
        for (int i : shape.childSlots) {
            collectNodes(shape.getters[i].apply(node), out);
        }
    }

    /** Visits the node and all its descendants, parents first. */
    public static void walk(Node node, Consumer<Node> visitor) {
        // An explicit stack: trees from deeply nested input must not overflow the Java stack.
        var stack = new ArrayList<Node>(32);
        stack.add(node);
        while (!stack.isEmpty()) {
            Node n = stack.remove(stack.size() - 1);
            visitor.accept(n);
            int from = stack.size();
            addChildren(n, stack);
            // the children were pushed in order; reversed, the first is popped first
            for (int i = from, j = stack.size() - 1; i < j; i++, j--) {
                stack.set(j, stack.set(i, stack.get(j)));
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

    /**
     * Structural equality that ignores every {@link Span}: the same as comparing {@link #stripSpans} of both,
     * without building the stripped copies.
     */
    public static boolean equalIgnoringSpans(Node a, Node b) {
        return sameNode(a, b);
    }

    private static boolean sameNode(Node a, Node b) {
        if (a == b) return true;
        if (a == null || b == null || a.getClass() != b.getClass()) return false;
        Shape shape = SHAPES.get(a.getClass());
        for (int i = 0; i < shape.getters.length; i++) {
            if (shape.slots[i] == Slot.SPAN) continue;
            if (!sameValue(shape.getters[i].apply(a), shape.getters[i].apply(b))) return false;
        }
        return true;
    }

    private static boolean sameValue(Object x, Object y) {
        if (x == y) return true;
        if (x == null || y == null) return false;
        if (x instanceof Node nx) return y instanceof Node ny && sameNode(nx, ny);
        if (x instanceof Optional<?> ox) {
            if (!(y instanceof Optional<?> oy) || ox.isPresent() != oy.isPresent()) return false;
            return ox.isEmpty() || sameValue(ox.get(), oy.get());
        }
        if (x instanceof List<?> lx) {
            if (!(y instanceof List<?> ly) || lx.size() != ly.size()) return false;
            for (int i = 0; i < lx.size(); i++) if (!sameValue(lx.get(i), ly.get(i))) return false;
            return true;
        }
        return x.equals(y);
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
        Shape shape = SHAPES.get(node.getClass());
        int n = shape.getters.length;
        Object[] args = new Object[n];
        boolean changed = false;
        for (int i = 0; i < n; i++) {
            Object old = shape.getters[i].apply(node);
            Object now = switch (shape.slots[i]) {
                case SPAN -> dropSpans ? Span.NONE : old;
                case PLAIN -> old;
                default -> rebuildValue(old, fn, dropSpans);
            };
            args[i] = now;
            changed |= now != old;
        }
        Node rebuilt = changed ? construct(shape, node.getClass(), args) : node;
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

    @SuppressWarnings("unchecked")
    private static Shape shapeOf(Class<?> type) {
        RecordComponent[] comps = type.getRecordComponents();
        if (comps == null) throw new IllegalStateException(type + " is not a record");
        MethodHandles.Lookup lookup = MethodHandles.lookup();
        Function<Object, Object>[] getters = new Function[comps.length];
        Slot[] slots = new Slot[comps.length];
        Class<?>[] types = new Class<?>[comps.length];
        int[] children = new int[comps.length];
        int nc = 0;
        try {
            for (int i = 0; i < comps.length; i++) {
                RecordComponent c = comps[i];
                types[i] = c.getType();
                getters[i] = getter(lookup, type, c);
                slots[i] = slotOf(c.getType());
                if (slots[i] == Slot.NODE || slots[i] == Slot.OPTIONAL || slots[i] == Slot.LIST) children[nc++] = i;
            }
            MethodHandle ctor = lookup.findConstructor(type, MethodType.methodType(void.class, types))
                    .asSpreader(Object[].class, comps.length)
                    .asType(MethodType.methodType(Object.class, Object[].class));
            return new Shape(getters, slots, java.util.Arrays.copyOf(children, nc), ctor);
        } catch (Throwable e) {
            throw new IllegalStateException("cannot read the components of " + type.getName(), e);
        }
    }

    private static Slot slotOf(Class<?> t) {
        if (Node.class.isAssignableFrom(t)) return Slot.NODE;
        if (t == Optional.class) return Slot.OPTIONAL;
        if (Collection.class.isAssignableFrom(t)) return Slot.LIST;
        if (t == Span.class) return Slot.SPAN;
        return Slot.PLAIN;
    }

    /** A plain {@code Function} calling the accessor, so reading a component costs an ordinary call. */
    @SuppressWarnings("unchecked")
    private static Function<Object, Object> getter(MethodHandles.Lookup lookup, Class<?> type, RecordComponent c)
            throws Throwable {
        MethodHandle accessor = lookup.unreflect(c.getAccessor());
        if (c.getType().isPrimitive()) {
            // the metafactory boxes primitive results itself; only the erased signature differs
            CallSite site = LambdaMetafactory.metafactory(lookup, "apply", MethodType.methodType(Function.class),
                    MethodType.methodType(Object.class, Object.class), accessor,
                    MethodType.methodType(wrapper(c.getType()), type));
            return (Function<Object, Object>) site.getTarget().invoke();
        }
        CallSite site = LambdaMetafactory.metafactory(lookup, "apply", MethodType.methodType(Function.class),
                MethodType.methodType(Object.class, Object.class), accessor, accessor.type());
        return (Function<Object, Object>) site.getTarget().invoke();
    }

    private static Class<?> wrapper(Class<?> primitive) {
        return MethodType.methodType(primitive).wrap().returnType();
    }

    private static Node construct(Shape shape, Class<?> type, Object[] args) {
        try {
            return (Node) (Object) shape.constructor.invokeExact(args);
        } catch (RuntimeException e) {
            throw e;
        } catch (Throwable e) {
            throw new IllegalStateException("cannot rebuild " + type.getSimpleName(), e);
        }
    }
}
