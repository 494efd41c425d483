/** The specification a new product lot is judged against until compliance chooses another (a built-in edition and grade). */
export const DEFAULT_PRODUCT_SPEC_KEY = "astm-d6751-23a/no-2-b-s15";
