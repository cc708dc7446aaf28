package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

/**
 * A document every command fills and every writer reads: a title, subtitle lines, sections of
 * paragraphs, tables and charts, then the warnings and the caution text.
 *
 * @param title     the heading
 * @param key       a short label of the run (the model file's name), lower-case words joined by hyphens;
 *                  it makes the LaTeX labels of two reports differ when one paper inputs both
 * @param subtitle  short lines under the heading (sample, method, long-run covariance)
 * @param sections  the body, in order
 * @param warnings  what a reader must see beside the numbers
 * @param caution   the closing caution; {@link Caution#TEXT} unless a command has more to say
 */
public record Report(String title, String key, List<String> subtitle, List<Section> sections,
        List<String> warnings, String caution) {

    public Report {
        if (!key.matches("[a-z0-9]+(-[a-z0-9]+)*")) {
            throw new IllegalArgumentException("report key \"" + key + "\" must be lower-case words joined by hyphens");
        }
        subtitle = List.copyOf(subtitle);
        sections = List.copyOf(sections);
        warnings = List.copyOf(warnings);
        List<String> ids = sections.stream().flatMap(s -> s.blocks().stream()).map(Report::idOf)
                .filter(java.util.Objects::nonNull).toList();
        for (String id : ids) {
            if (ids.indexOf(id) != ids.lastIndexOf(id)) {
                throw new IllegalArgumentException("two blocks are the same " + id + ": ids name files, so they must differ");
            }
        }
    }

    private static String idOf(Block block) {
        if (block instanceof TableBlock table) {
            return "table " + table.table().id();
        }
        return block instanceof ChartBlock chart ? "chart " + chart.chart().id() : null;
    }

    /** A part of the body: a heading and its blocks. */
    public record Section(String heading, List<Block> blocks) {
        public Section {
            blocks = List.copyOf(blocks);
        }
    }

    /** One block of a section. */
    public sealed interface Block {
    }

    /** A paragraph of plain text. */
    public record Paragraph(String text) implements Block {
    }

    /** A table placed in the text. */
    public record TableBlock(Table table) implements Block {
    }

    /** A chart placed in the text. */
    public record ChartBlock(Chart chart) implements Block {
    }

    /** Every table, in document order. */
    public List<Table> tables() {
        return blocks().filter(TableBlock.class::isInstance).map(b -> ((TableBlock) b).table()).toList();
    }

    /** Every chart, in document order. */
    public List<Chart> charts() {
        return blocks().filter(ChartBlock.class::isInstance).map(b -> ((ChartBlock) b).chart()).toList();
    }

    private Stream<Block> blocks() {
        return sections.stream().flatMap(s -> s.blocks().stream());
    }

    /** Starts a report with the standard caution. */
    public static Builder builder(String title) {
        return new Builder(title);
    }

    /** Builds a {@link Report} section by section. */
    public static final class Builder {
        private final String title;
        private String key = "report";
        private final List<String> subtitle = new ArrayList<>();
        private final List<Section> sections = new ArrayList<>();
        private final List<String> warnings = new ArrayList<>();
        private String caution = Caution.TEXT;
        private String heading;
        private List<Block> blocks;

        private Builder(String title) {
            this.title = title;
        }

        /**
         * Sets the run's short label from any text (a model file's name): lower-cased, every run of
         * other characters turned into one hyphen.
         */
        public Builder key(String text) {
            String cleaned = text.toLowerCase(java.util.Locale.ROOT).replaceAll("[^a-z0-9]+", "-")
                    .replaceAll("^-+|-+$", "");
            key = cleaned.isEmpty() ? "report" : cleaned;
            return this;
        }

        /** Adds a line under the title. */
        public Builder subtitle(String line) {
            subtitle.add(line);
            return this;
        }

        /** Closes the current section, if any, and opens a new one. */
        public Builder section(String sectionHeading) {
            closeSection();
            heading = sectionHeading;
            blocks = new ArrayList<>();
            return this;
        }

        /** Adds a paragraph to the current section. */
        public Builder paragraph(String text) {
            current().add(new Paragraph(text));
            return this;
        }

        /** Adds a table to the current section. */
        public Builder table(Table table) {
            current().add(new TableBlock(table));
            return this;
        }

        /** Adds a chart to the current section. */
        public Builder chart(Chart chart) {
            current().add(new ChartBlock(chart));
            return this;
        }

        /** Adds warnings. */
        public Builder warnings(List<String> more) {
            warnings.addAll(more);
            return this;
        }

        /** Replaces the caution text. */
        public Builder caution(String text) {
            caution = text;
            return this;
        }

        /** The finished report. */
        public Report build() {
            closeSection();
            return new Report(title, key, subtitle, sections, warnings, caution);
        }

        private List<Block> current() {
            if (blocks == null) {
                throw new IllegalStateException("open a section before adding blocks");
            }
            return blocks;
        }

        private void closeSection() {
            if (blocks != null) {
                sections.add(new Section(heading, blocks));
                blocks = null;
            }
        }
    }
}
