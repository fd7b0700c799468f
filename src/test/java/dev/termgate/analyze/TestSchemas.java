package dev.termgate.analyze;

import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.LangString;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;
import dev.termgate.schema.ValueType;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Optional;
import java.util.Set;

/**
 * Small schemas built by hand, so that analyzer tests do not depend on the ontology reader. The shipping one
 * mirrors a few terms of the demo ontology (examples/maritime) with invented names of our own.
 */
public final class TestSchemas {
    private static final String NS = "https://example.org/test#";

    private TestSchemas() {}

    public static GraphSchema shipping() {
        List<NodeLabel> labels = new ArrayList<>();
        labels.add(label("Organisation", List.of(), List.of("organization"), false));
        labels.add(label("Company", List.of("Organisation"), List.of("firm"), false));
        labels.add(label("Carrier", List.of("Company"), List.of("shipping line", "operator"), false));
        labels.add(label("Vessel", List.of(), List.of("ship", "boat"), false));
        labels.add(label("Tanker", List.of("Vessel"), List.of(), false));
        labels.add(label("Port", List.of(), List.of("harbour"), false));
        labels.add(label("PortCall", List.of(), List.of("stop"), false));
        labels.add(label("Voyage", List.of(), List.of("trip"), false));
        labels.add(label("Shipment", List.of(), List.of("consignment"), false));
        labels.add(label("Container", List.of(), List.of("box"), false));
        labels.add(label("Berth", List.of(), List.of(), true));
        List<RelType> rels = new ArrayList<>();
        rels.add(rel("OPERATED_BY", List.of(new Endpoint("Vessel", "Carrier")), Set.of(), "OPERATES", false));
        rels.add(rel("OPERATES", List.of(), Set.of(), "OPERATED_BY", false));
        rels.add(rel("SAILED_BY", List.of(new Endpoint("Voyage", "Vessel")), Set.of(), null, false));
        rels.add(rel("HAS_PORT_CALL", List.of(new Endpoint("Voyage", "PortCall")), Set.of(), null, false));
        rels.add(rel("CALLS_AT", List.of(new Endpoint("PortCall", "Port")), Set.of(), null, false));
        rels.add(rel("BOOKED_ON", List.of(new Endpoint("Shipment", "Voyage")), Set.of(), null, false));
        rels.add(rel("PACKED_IN", List.of(new Endpoint("Shipment", "Container")), Set.of(), null, false));
        rels.add(rel("NEAR", List.of(new Endpoint("Port", "Port")), Set.of(), null, true));
        rels.add(rel("INVOLVES", List.of(new Endpoint("Shipment", "Organisation")), Set.of(), null, false));
        rels.add(rel("SHIPPED_BY", List.of(new Endpoint("Shipment", "Company")), Set.of("INVOLVES"), null, false));
        rels.add(rel("RELATED_TO", List.of(), Set.of(), null, false));
        List<PropertyKey> props = new ArrayList<>();
        props.add(prop("name", ValueType.STRING, false, "Organisation", "Vessel", "Port"));
        props.add(prop("imoNumber", ValueType.STRING, false, "Vessel"));
        props.add(prop("vesselName", ValueType.STRING, false, "Vessel"));
        props.add(prop("grossTonnage", ValueType.INTEGER, false, "Vessel"));
        props.add(prop("arrivalTime", ValueType.DATETIME, false, "PortCall"));
        props.add(prop("unlocode", ValueType.STRING, false, "Port"));
        props.add(prop("weightKg", ValueType.FLOAT, false, "Shipment"));
        props.add(prop("hazardous", ValueType.BOOLEAN, false, "Shipment"));
        props.add(prop("oldCode", ValueType.STRING, true, "Port"));
        props.add(prop("note", ValueType.STRING, false));
        return GraphSchema.of("test", labels, rels, props, List.of());
    }

    static NodeLabel label(String name, List<String> supers, List<String> alt, boolean deprecated) {
        return new NodeLabel(info(TermKind.LABEL, name, alt, deprecated), Set.copyOf(supers), Set.of());
    }

    static RelType rel(String name, List<Endpoint> eps, Set<String> supers, String inverse, boolean symmetric) {
        return new RelType(info(TermKind.RELATIONSHIP, name, List.of(), false), eps, supers, Optional.ofNullable(inverse),
                symmetric);
    }

    static PropertyKey prop(String name, ValueType t, boolean deprecated, String... domains) {
        return new PropertyKey(info(TermKind.PROPERTY, name, List.of(), deprecated), Set.of(domains),
                Optional.empty(), t, Set.of());
    }

    static TermInfo info(TermKind kind, String name, List<String> alt, boolean deprecated) {
        return new TermInfo(kind, NS + name, name, List.of(new LangString(name, "en")),
                alt.stream().map(a -> new LangString(a, "en")).toList(), List.of(), deprecated);
    }

    static List<String> list(String... s) {
        return Arrays.asList(s);
    }
}
