package dev.termgate.translate;

import java.util.function.Supplier;

/** A value computed on first use, once, by whichever thread asks first. */
final class Memo<T> implements Supplier<T> {
    private Supplier<T> source;
    private T value;

    private Memo(Supplier<T> source) {
        this.source = source;
    }

    static <T> Supplier<T> of(Supplier<T> source) {
        return source instanceof Memo<T> ? source : new Memo<>(source);
    }

    @Override
    public synchronized T get() {
        if (source != null) {
            value = source.get();
            source = null;
        }
        return value;
    }
}
