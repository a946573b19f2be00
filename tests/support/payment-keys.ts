/** The invented test-mode keys the test run gives both the app and the payment fake. */
export const TEST_PAYMENT_KEYS = {
  secretKey: 'sk_test_varledgerSuiteKey4821',
  webhookSecret: 'whsec_varledgerSuiteSigning9730',
};
