package dev.termgate.analyze;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * The allow-list of functions: the openCypher 9 standard functions (aggregating, scalar, list, mathematical,
 * string, temporal, spatial) with their numbers of arguments. Source: the openCypher 9 function tables, from
 * memory, and cross-checked against every function the openCypher TCK (M23) calls in its read queries.
 * Names are case-insensitive, as in openCypher.
 */
final class Functions {

    /** {@code max} is -1 for any number of arguments. */
    record Signature(String name, int min, int max) {
        String arity() {
            if (max < 0) return min + " or more";
            return min == max ? String.valueOf(min) : min + " to " + max;
        }
    }

    private static final Map<String, Signature> KNOWN = new LinkedHashMap<>();

    static {
        // aggregating
        add("count", 1, 1); add("sum", 1, 1); add("avg", 1, 1); add("min", 1, 1); add("max", 1, 1);
        add("collect", 1, 1); add("stDev", 1, 1); add("stDevP", 1, 1);
        add("percentileCont", 2, 2); add("percentileDisc", 2, 2);
        // scalar and graph
        add("coalesce", 1, -1); add("endNode", 1, 1); add("startNode", 1, 1); add("head", 1, 1); add("last", 1, 1);
        add("id", 1, 1); add("elementId", 1, 1); add("length", 1, 1); add("size", 1, 1); add("type", 1, 1);
        add("properties", 1, 1); add("timestamp", 0, 0); add("toBoolean", 1, 1); add("toInteger", 1, 1);
        add("toFloat", 1, 1); add("toString", 1, 1); add("toBooleanOrNull", 1, 1); add("toIntegerOrNull", 1, 1);
        add("toFloatOrNull", 1, 1); add("toStringOrNull", 1, 1); add("exists", 1, 1); add("isEmpty", 1, 1);
        // lists
        add("keys", 1, 1); add("labels", 1, 1); add("nodes", 1, 1); add("relationships", 1, 1);
        add("range", 2, 3); add("reverse", 1, 1); add("tail", 1, 1);
        // mathematical
        add("abs", 1, 1); add("ceil", 1, 1); add("floor", 1, 1); add("rand", 0, 0); add("round", 1, 3);
        add("sign", 1, 1); add("e", 0, 0); add("exp", 1, 1); add("log", 1, 1); add("log10", 1, 1); add("sqrt", 1, 1);
        add("pi", 0, 0); add("acos", 1, 1); add("asin", 1, 1); add("atan", 1, 1); add("atan2", 2, 2); add("cos", 1, 1);
        add("cot", 1, 1); add("degrees", 1, 1); add("haversin", 1, 1); add("radians", 1, 1); add("sin", 1, 1);
        add("tan", 1, 1);
        // string
        add("left", 2, 2); add("right", 2, 2); add("lTrim", 1, 1); add("rTrim", 1, 1); add("trim", 1, 1);
        add("replace", 3, 3); add("split", 2, 2); add("substring", 2, 3); add("toLower", 1, 1); add("toUpper", 1, 1);
        // temporal
        for (String t : List.of("date", "datetime", "localdatetime", "localtime", "time")) {
            add(t, 0, 1);
            add(t + ".truncate", 2, 3);
            add(t + ".transaction", 0, 1);
            add(t + ".statement", 0, 1);
            add(t + ".realtime", 0, 1);
        }
        add("datetime.fromepoch", 2, 2); add("datetime.fromepochmillis", 1, 1);
        add("duration", 1, 1); add("duration.between", 2, 2); add("duration.inMonths", 2, 2);
        add("duration.inDays", 2, 2); add("duration.inSeconds", 2, 2);
        // spatial
        add("point", 1, 1); add("distance", 2, 2); add("point.distance", 2, 2);
    }

    private static void add(String name, int min, int max) {
        KNOWN.put(name.toLowerCase(Locale.ROOT), new Signature(name, min, max));
    }

    private Functions() {}

    static Signature lookup(String qualifiedName) {
        return KNOWN.get(qualifiedName.toLowerCase(Locale.ROOT));
    }

    /** Known names within edit distance 2 of a written one, closest first (for "did you mean"). */
    static List<String> near(String qualifiedName) {
        String w = qualifiedName.toLowerCase(Locale.ROOT);
        return KNOWN.entrySet().stream()
                .map(e -> Map.entry(e.getValue().name(), Lenient.distance(w, e.getKey())))
                .filter(e -> e.getValue() <= (w.length() <= 4 ? 1 : 2))
                .sorted(Map.Entry.<String, Integer>comparingByValue().thenComparing(Map.Entry.comparingByKey()))
                .limit(3).map(Map.Entry::getKey).toList();
    }

    static Type resultType(String lowerName) {
        return switch (lowerName) {
            case "count", "size", "length", "tointeger", "id", "timestamp", "sign" -> Type.INTEGER;
            case "tostring", "tolower", "toupper", "trim", "ltrim", "rtrim", "replace", "substring", "left", "right",
                 "type", "elementid" -> Type.STRING;
            case "collect", "keys", "labels", "nodes", "relationships", "range", "split", "tail" -> Type.LIST;
            case "properties" -> Type.MAP;
            case "exists", "isempty", "toboolean" -> Type.BOOLEAN;
            case "tofloat", "avg", "sqrt", "rand", "pi", "e", "exp", "log", "log10" -> Type.FLOAT;
            case "startnode", "endnode" -> Type.NODE;
            default -> Type.ANY;
        };
    }
}
