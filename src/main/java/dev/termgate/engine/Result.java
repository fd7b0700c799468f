package dev.termgate.engine;

import java.util.List;

/**
 * Rows of one run. {@code truncated} is set when the row cap cut the result: the rows are then only the
 * first {@code rows.size()} of a longer answer.
 *
 * @param rows      each row has one value per column, in the value model of {@link Values}
 * @param compileNanos time to build the plan; {@code runNanos} time to execute it
 */
public record Result(List<String> columns, List<List<Object>> rows, boolean truncated, Plan plan,
                     long compileNanos, long runNanos) {
    public Result {
        columns = List.copyOf(columns);
        rows = List.copyOf(rows);
    }
}
