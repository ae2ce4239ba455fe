// Boost.Math error policy used everywhere in core/: never throw (the browser build aborts on
// an uncaught exception); domain and overflow errors come back as NaN / inf, which every caller
// checks before a number reaches a user.
#pragma once
#include <boost/math/policies/policy.hpp>

namespace tallyproof {

using quiet_policy = boost::math::policies::policy<
    boost::math::policies::domain_error<boost::math::policies::ignore_error>,
    boost::math::policies::pole_error<boost::math::policies::ignore_error>,
    boost::math::policies::overflow_error<boost::math::policies::ignore_error>,
    boost::math::policies::underflow_error<boost::math::policies::ignore_error>,
    boost::math::policies::denorm_error<boost::math::policies::ignore_error>,
    boost::math::policies::evaluation_error<boost::math::policies::ignore_error>,
    boost::math::policies::rounding_error<boost::math::policies::ignore_error>,
    boost::math::policies::indeterminate_result_error<boost::math::policies::ignore_error>,
    boost::math::policies::promote_double<false>>;

}  // namespace tallyproof
