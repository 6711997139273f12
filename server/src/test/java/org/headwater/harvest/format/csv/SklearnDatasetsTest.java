package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import java.math.BigDecimal;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

/**
 * Open datasets shipped by Debian's python3-sklearn package, checked against their published
 * shapes. scikit-learn writes a first line of its own, "n_samples,n_features,class names...",
 * above the data (its loader reads it as such); it is neither header nor data, so the right
 * answer is skipLines = 1 and, for iris and wine, no header.
 */
class SklearnDatasetsTest {

  private static final String INSTALL = "apt-get install -y --no-install-recommends python3-sklearn";

  private Path data;

  @BeforeEach
  void locate() {
    Path root = ExternalSuite.locate("headwater.sklearnDatasets",
        "/usr/lib/python3/dist-packages/sklearn/datasets");
    if (root == null || !Files.isDirectory(root.resolve("data"))) {
      ExternalSuite.missing("scikit-learn's bundled datasets", INSTALL);
    }
    data = root.resolve("data");
  }

  private CsvSniff sniff(String file) throws Exception {
    return Fixtures.sniff(Files.readAllBytes(data.resolve(file)));
  }

  private static void assertRange(ColumnProfile column, String min, String max) {
    assertThat(new BigDecimal(column.min())).as(column.name() + " min").isEqualByComparingTo(min);
    assertThat(new BigDecimal(column.max())).as(column.name() + " max").isEqualByComparingTo(max);
  }

  @Test
  void irisHas150RowsOfFourMeasurementsAndAClass() throws Exception {
    CsvSniff s = sniff("iris.csv");
    // expected: sklearn/datasets/descr/iris.rst (same package) and UCI iris.names: 150
    // instances, 4 numeric attributes and the class, no missing values
    assertThat(s.encodingName()).isEqualTo("utf-8");
    assertThat(s.dialect().delimiter()).isEqualTo(',');
    assertThat(s.skipLines()).isEqualTo(1);
    assertThat(s.header()).isFalse();
    assertThat(s.rowCount()).isEqualTo(150);
    assertThat(s.rowCountExact()).isTrue();
    assertThat(s.columns()).extracting(ColumnProfile::type).containsExactly(LogicalType.DECIMAL,
        LogicalType.DECIMAL, LogicalType.DECIMAL, LogicalType.DECIMAL, LogicalType.INTEGER);
    assertThat(s.columns()).extracting(ColumnProfile::nullCount).containsOnly(0L);
    // expected: the Min and Max of the "Summary Statistics" table in iris.rst
    assertRange(s.columns().get(0), "4.3", "7.9");
    assertRange(s.columns().get(1), "2.0", "4.4");
    assertRange(s.columns().get(2), "1.0", "6.9");
    assertRange(s.columns().get(3), "0.1", "2.5");
    // expected: three classes (iris.rst), encoded 0, 1, 2 by scikit-learn
    assertRange(s.columns().get(4), "0", "2");
    assertThat(s.columns().get(4).distinctEstimate()).isEqualTo(3);
  }

  @Test
  void wineHas178RowsOf13AttributesAndAClass() throws Exception {
    CsvSniff s = sniff("wine_data.csv");
    // expected: sklearn/datasets/descr/wine_data.rst: 178 instances, 13 numeric attributes
    // and the class, no missing values
    assertThat(s.skipLines()).isEqualTo(1);
    assertThat(s.header()).isFalse();
    assertThat(s.rowCount()).isEqualTo(178);
    assertThat(s.columns()).hasSize(14);
    assertThat(s.columns()).extracting(ColumnProfile::nullCount).containsOnly(0L);
    // expected: Min and Max of Malic Acid and Proline in the Summary Statistics table
    assertRange(s.columns().get(1), "0.74", "5.80");
    assertRange(s.columns().get(12), "278", "1680");
    assertThat(s.columns().get(13).distinctEstimate()).isEqualTo(3);
  }

  @Test
  void bostonHousingHas506RowsUnderANamedHeader() throws Exception {
    CsvSniff s = sniff("boston_house_prices.csv");
    // expected: Harrison and Rubinfeld (1978) as published in the UCI Housing data set: 506
    // tracts, 13 attributes and the median value MEDV; CHAS is a 0/1 dummy variable
    assertThat(s.skipLines()).isEqualTo(1);
    assertThat(s.header()).isTrue();
    assertThat(s.rowCount()).isEqualTo(506);
    assertThat(s.columns()).extracting(ColumnProfile::name).isEqualTo(List.of("CRIM", "ZN",
        "INDUS", "CHAS", "NOX", "RM", "AGE", "DIS", "RAD", "TAX", "PTRATIO", "B", "LSTAT", "MEDV"));
    ColumnProfile chas = s.columns().get(3);
    assertThat(chas.type()).isEqualTo(LogicalType.INTEGER);
    assertThat(chas.distinctEstimate()).isEqualTo(2);
    // MEDV is censored at 50 (thousand dollars): from memory of the data set's documentation
    assertThat(new BigDecimal(s.columns().get(13).max())).isEqualByComparingTo("50");
  }
}
