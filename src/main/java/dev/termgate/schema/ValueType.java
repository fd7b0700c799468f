package dev.termgate.schema;

import java.util.Locale;

/** The property-graph value type of a datatype property, from its XSD (or RDF) range. */
public enum ValueType {
    STRING, INTEGER, FLOAT, BOOLEAN, DATE, DATETIME, LOCALDATETIME, TIME, DURATION, ANY;

    /** Maps an XSD / RDF datatype IRI; unknown and absent ranges give {@link #ANY}. */
    public static ValueType fromDatatype(String iri) {
        if (iri == null) return ANY;
        String local = Names.localName(iri).toLowerCase(Locale.ROOT);
        return switch (local) {
            case "string", "normalizedstring", "token", "language", "name", "ncname", "anyuri", "langstring",
                 "plainliteral", "html", "xmlliteral", "gyear", "gyearmonth", "gmonth", "gday", "gmonthday", "text", "url" -> STRING;
            case "integer", "int", "long", "short", "byte", "nonnegativeinteger", "positiveinteger",
                 "nonpositiveinteger", "negativeinteger", "unsignedint", "unsignedlong", "unsignedshort",
                 "unsignedbyte", "number" -> INTEGER;
            case "decimal", "double", "float" -> FLOAT;
            case "boolean" -> BOOLEAN;
            case "date" -> DATE;
            case "datetime", "datetimestamp" -> DATETIME;
            case "time" -> TIME;
            case "duration", "daytimeduration", "yearmonthduration" -> DURATION;
            default -> ANY;
        };
    }

    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }
}
